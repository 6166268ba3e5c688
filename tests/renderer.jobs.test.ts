import { describe, expect, it } from 'vitest';
import { syntheticCsv } from '../shared/demo/syntheticTrial';
import type { JobContext } from '../renderer/src/lib/workerProtocol';
import { readFiles } from '../renderer/src/worker/jobs';

const ctx: JobContext = { cancelled: false, progress: async () => {}, partial: async () => {} };

describe('worker job readFiles', () => {
  it('reads good files and turns a bad one into a message naming it, in the given order', async () => {
    const good = {
      name: 'Two sites.csv',
      bytes: new TextEncoder().encode(syntheticCsv({ sites: 2 })),
    };
    const empty = { name: 'Empty export.csv', bytes: new Uint8Array(0) };
    const legacy = {
      name: 'Old book.xls',
      bytes: new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0]),
    };
    const out = await readFiles([good, empty, legacy], ctx);
    expect(out.map((o) => [o.name, o.ok])).toEqual([
      ['Two sites.csv', true],
      ['Empty export.csv', false],
      ['Old book.xls', false],
    ]);
    for (const bad of out.slice(1)) {
      if (bad.ok) throw new Error('expected a failure');
      expect(bad.message).toContain(bad.name);
    }
    const first = out[0];
    if (!first.ok) throw new Error(first.message);
    expect(first.workbook.sheets[0].rows.length).toBe(49);
  });
});
