// The workspace's state classes with a real job server on a MessageChannel
// (the same handlers the worker serves), no browser.
import { describe, expect, it } from 'vitest';
import { syntheticCsv } from '../shared/demo/syntheticTrial';
import { setColumnRole } from '../renderer/src/analysis/edits';
import { nodeWorkspace } from './support/nodeWorkspace';

const workspace = nodeWorkspace;

const file = () => ({
  name: 'Four sites.csv',
  bytes: new TextEncoder().encode(syntheticCsv({ sites: 4, seed: 21 })),
});

describe('Workspace state', () => {
  it('opening a file detects its columns, builds the table and shows the column review', async () => {
    const ws = workspace();
    await ws.openFiles([file()]);
    expect(ws.step).toBe('columns');
    expect(ws.trial.table?.plots).toHaveLength(96);
    // The file's rates are in lb N/ac: the workspace shows US units, as the command line would.
    expect(ws.settings.unitSystem).toBe('us');
  });

  it('files opened without the review (the demo) go straight to the first site', async () => {
    const ws = workspace();
    await ws.openFiles([file()], { review: false });
    expect(ws.step).toBe('site');
    expect(ws.trial.table?.plots).toHaveLength(96);
  });

  it('a metric file opens in metric units, and a later file does not switch them', async () => {
    const ws = workspace();
    ws.settings.unitSystem = 'us';
    const metric = new TextEncoder().encode(
      'Site,Rep,Plot,N rate (kg N/ha),Yield (t/ha)\nHollin Cross,1,101,0,6.1\nHollin Cross,1,102,90,8.2\n',
    );
    await ws.openFiles([{ name: 'metric.csv', bytes: metric }]);
    expect(ws.settings.unitSystem).toBe('metric');
    await ws.openFiles([file()]);
    expect(ws.settings.unitSystem).toBe('metric');
  });

  it('asks for the crop when no sheet names it, and stops asking once answered (undoable)', async () => {
    const ws = workspace();
    const unnamed = new TextEncoder().encode(
      'Site,Rep,Plot,N rate (kg N/ha),Yield (t/ha)\nHollin Cross,1,101,0,6.1\nHollin Cross,1,102,90,8.2\n',
    );
    await ws.openFiles([{ name: 'plots.csv', bytes: unnamed }]);
    expect(ws.trial.cropUnknown).toBe(true);
    ws.trial.setCrop('wheat');
    expect(ws.trial.cropUnknown).toBe(false);
    expect(ws.trial.table!.crop).toBe('wheat');
    ws.trial.undo();
    expect(ws.trial.cropUnknown).toBe(true);
    // A file whose title or name says its crop is not asked about.
    const named = workspace();
    await named.openFiles([{ name: 'Hollin Cross wheat 2025.csv', bytes: unnamed }]);
    expect(named.trial.cropUnknown).toBe(false);
    expect(named.trial.table!.crop).toBe('wheat');
  });

  it('a mapping change is undone and redone with the table following', async () => {
    const ws = workspace();
    await ws.openFiles([file()]);
    const mapping = ws.trial.edits.mappings['Four sites.csv'];
    const moisture = mapping.sheets[0].columns.find((c) => c.role === 'moisture')!;
    const adjusted = ws.trial.table!.plots[0].yieldKgHa;
    ws.trial.change('Moisture aside', {
      ...ws.trial.edits,
      mappings: {
        'Four sites.csv': setColumnRole(mapping, mapping.sheets[0].sheet, moisture.col, 'ignore'),
      },
    });
    expect(ws.trial.undoLabel).toBe('Moisture aside');
    const raw = ws.trial.table!.plots[0].yieldKgHa;
    expect(raw).not.toBe(adjusted);
    ws.trial.undo();
    expect(ws.trial.table!.plots[0].yieldKgHa).toBe(adjusted);
    expect(ws.trial.redoLabel).toBe('Moisture aside');
    ws.trial.redo();
    expect(ws.trial.table!.plots[0].yieldKgHa).toBe(raw);
  });

  it('price changes are steps of the same undo history as mapping changes, a typed price one step', async () => {
    const ws = workspace();
    await ws.openFiles([file()]);
    const start = ws.prices.settings;
    const mapping = ws.trial.edits.mappings['Four sites.csv'];
    const moisture = mapping.sheets[0].columns.find((c) => c.role === 'moisture')!;
    ws.trial.change('Moisture aside', {
      ...ws.trial.edits,
      mappings: {
        'Four sites.csv': setColumnRole(mapping, mapping.sheets[0].sheet, moisture.col, 'ignore'),
      },
    });
    // "0", "0.", "0.6", "0.62" typed into the product price: one step.
    for (const v of [0, 0.6, 0.62]) ws.prices.update({ productPerKg: v });
    ws.prices.setTolerance(15);
    expect(ws.history.undoLabel).toBe('Shortfall tolerance');
    ws.history.undo();
    expect(ws.prices.shortfallTolerancePerHa).toBeNull();
    expect(ws.history.undoLabel).toBe('Product price');
    ws.history.undo();
    expect(ws.prices.settings).toEqual(start);
    expect(ws.history.undoLabel).toBe('Moisture aside');
    ws.history.undo();
    expect(ws.trial.edits.mappings['Four sites.csv']).toBe(mapping);
    ws.history.redo();
    ws.history.redo();
    expect(ws.prices.settings.productPerKg).toBe(0.62);
    expect(ws.prices.settings.illustrative).toBe(false);
    expect(ws.history.redoLabel).toBe('Shortfall tolerance');
  });

  it('fits in the worker, then a price change re-prices the optima without a refit', async () => {
    const ws = workspace();
    await ws.openFiles([file()]);
    await ws.analysis.run(ws.trial.table);
    const output = ws.analysis.output;
    expect(output?.across.sites).toHaveLength(4);
    const before = ws.analysis.optima.map((o) => o.optimum?.rateKgHa ?? NaN);
    ws.prices.update({ productPerKg: ws.prices.settings.productPerKg * 3 });
    const after = ws.analysis.optima.map((o) => o.optimum?.rateKgHa ?? NaN);
    expect(ws.analysis.output).toBe(output);
    after.forEach((rate, i) => expect(rate).toBeLessThanOrEqual(before[i]));
    expect(after.some((rate, i) => rate < before[i])).toBe(true);
    expect(ws.prices.settings.illustrative).toBe(false);
  });

  it('a saved session restores the same files, edits and prices into a fresh workspace', async () => {
    const ws = workspace();
    await ws.openFiles([file()]);
    const id = ws.trial.table!.plots[3].id;
    ws.trial.change('Exclude', {
      ...ws.trial.edits,
      decisions: { [id]: { action: 'exclude', reason: 'wheel track' } },
    });
    ws.prices.update({ grainPerKg: 0.21 });
    ws.settings.unitSystem = 'us';
    ws.step = 'prices';
    const saved = JSON.parse(JSON.stringify(ws.session()));

    const again = workspace();
    await again.restore(saved);
    expect(again.sources.files[0].bytes).toEqual(ws.sources.files[0].bytes);
    expect(again.trial.table!.plots.find((p) => p.id === id)!.excluded).toEqual({
      reason: 'wheel track',
      by: 'user',
    });
    expect(again.prices.settings.grainPerKg).toBe(0.21);
    expect(again.settings.unitSystem).toBe('us');
    expect(again.step).toBe('prices');
  });
});

describe('Workspace reopening a file', () => {
  it('a file opened again under the same name gets a mapping for its new layout', async () => {
    const ws = workspace();
    await ws.openFiles([file()]);
    // Same name, different layout: plot weights instead of yields would break the old mapping.
    const csv =
      'Site,Block,N (kg N/ha),Yield (t/ha)\nA,1,0,7.1\nA,1,100,9.9\nA,2,0,6.8\nA,2,100,10.2\n';
    await ws.openFiles([{ name: 'Four sites.csv', bytes: new TextEncoder().encode(csv) }]);
    expect(ws.trial.built?.ok).toBe(true);
    expect(ws.trial.table!.plots).toHaveLength(4);
    expect(ws.trial.table!.plots[1].rateKgHa).toBe(100);
  });
});

describe('Workspace stopping the fits', () => {
  it('Cancel stops the fits, says so, and a new run fits the same table', async () => {
    const ws = workspace();
    await ws.openFiles([file()]);
    const running = ws.analysis.run(ws.trial.table);
    ws.jobs.cancel();
    await running;
    expect(ws.analysis.stopped).toBe(true);
    expect(ws.analysis.output).toBeNull();
    await ws.analysis.run(ws.trial.table);
    expect(ws.analysis.stopped).toBe(false);
    expect(ws.analysis.output?.across.sites).toHaveLength(4);
  });
});
