// The grower recommendation PDF, checked outside the project: poppler's
// pdftoppm renders every page to PNG (page count, page size in pixels at
// 72 dpi = size in points) and pdftotext reads the words back (the cautions
// and the recommended rate must be on every page). Letter is 612 × 792 pt
// (ANSI/ASME Y14.1, 8.5 × 11 in); A4 is 210 × 297 mm (ISO 216) = 595.3 × 841.9 pt.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { growerPdf } from '../cli/growerPdf';
import { recommendationCautions } from '../shared/economics/recommendationCautions';
import { growerPage } from '../shared/report/growerPage';
import type { TrialReport } from '../shared/report/trialReport';
import { reportGrowerPages } from '../shared/report/workbook';
import { demoReport } from './report.fixture';

let us: TrialReport;
let metric: TrialReport;
const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-pdf-'));

function pngSize(file: string): [number, number] {
  const b = readFileSync(file);
  // IHDR width and height, big-endian at bytes 16–23 (PNG specification §11.2.2).
  return [b.readUInt32BE(16), b.readUInt32BE(20)];
}

async function render(
  report: TrialReport,
  name: string,
): Promise<{ pngs: string[]; text: string[] }> {
  const pages = reportGrowerPages(report);
  const pdf = path.join(dir, `${name}.pdf`);
  writeFileSync(pdf, await growerPdf(pages, {}, new Date(report.createdAt)));
  execFileSync('/usr/bin/pdftoppm', ['-r', '72', '-png', pdf, path.join(dir, name)]);
  const pngs = readdirSync(dir)
    .filter((f) => f.startsWith(`${name}-`) && f.endsWith('.png'))
    .sort()
    .map((f) => path.join(dir, f));
  const text = pages.map((_, i) =>
    execFileSync('/usr/bin/pdftotext', [
      '-f',
      String(i + 1),
      '-l',
      String(i + 1),
      '-layout',
      pdf,
      '-',
    ]).toString(),
  );
  return { pngs, text };
}

/** Group pages the packet holds: one per value, with two sites or more, of each grouping column. */
function groupValues(report: TrialReport): number {
  return (report.acrossSites?.groups ?? []).reduce(
    (n, g) => n + g.values.filter((v) => v.sites.length >= 2).length,
    0,
  );
}

beforeAll(async () => {
  us = await demoReport('us', 40);
  metric = await demoReport('metric', 40);
});

describe('growerPdf', () => {
  it('writes one Letter page per site, one for the region and one per group with US units', async () => {
    const { pngs } = await render(us, 'us');
    expect(pngs.length).toBe(us.sites.length + 1 + groupValues(us));
    for (const p of pngs) expect(pngSize(p)).toEqual([612, 792]);
  });

  it('writes A4 pages with metric units', async () => {
    const { pngs } = await render(metric, 'metric');
    expect(pngs.length).toBe(metric.sites.length + 1 + groupValues(metric));
    // pdftoppm rounds each side up to whole pixels.
    for (const p of pngs) expect(pngSize(p)).toEqual([596, 842]);
  });

  it('prints the rate, the product amount and every caution on each page', async () => {
    const { text } = await render(us, 'us-text');
    const pages = reportGrowerPages(us);
    pages.forEach((p, i) => {
      const t = text[i].replace(/\s+/g, ' ');
      expect(t).toContain(p.recommendation);
      for (const c of recommendationCautions) expect(t).toContain(c.replace(/\s+/g, ' '));
    });
    expect(text.join(' ')).toMatch(/of Urea 46-0-0/);
  });

  it('prints the grower, field, season and advisor under the title, and a line where one is blank', async () => {
    const fields = { grower: 'Ada Brinkwater', field: 'Long Acre', season: '2026', advisor: '' };
    const addressed = { ...us, settings: { ...us.settings, pageFields: fields } };
    const { text } = await render(addressed, 'us-fields');
    for (const page of text) {
      const t = page.replace(/\s+/g, ' ');
      expect(t).toContain('Grower: Ada Brinkwater');
      expect(t).toContain('Field: Long Acre');
      expect(t).toContain('Season: 2026');
      expect(t).toMatch(/Advisor: _{5,}/);
    }
  });
});

describe('growerPage', () => {
  it('states the product amount as rate ÷ N fraction (urea 46 % N), rounded to 5 lb', () => {
    const site = us.sites.find((s) => s.bestModel !== null && growerPage(us, s.site).rate! > 0)!;
    const page = growerPage(us, site.site);
    const m = /≈ ([\d,]+) lb\/ac of Urea/.exec(page.productRecommendation)!;
    const product = Number(m[1].replace(',', ''));
    const best = site.models.find((x) => x.model === site.bestModel)!;
    // 1 lb/ac = 1.120851 kg/ha (NIST SP 811 pound, 43 560 ft² acre).
    const lbN = best.optimumRateKgHa! / 1.1208511557;
    expect(Math.abs(product - lbN / 0.46)).toBeLessThanOrEqual(2.5 + 1e-9);
    expect(product % 5).toBe(0);
  });

  it('says in plain words how sure the estimate is, from the bootstrap interval', () => {
    for (const s of us.sites) {
      const page = growerPage(us, s.site);
      if (s.bootstrap?.ciKgHa) {
        expect(page.certainty.level).not.toBe('unknown');
        expect(page.certainty.text).toMatch(
          /(between \d+ lb N\/ac and \d+ lb N\/ac|at \d+ lb N\/ac) in 90 of 100/,
        );
      }
    }
  });

  it('refuses a site the report does not have', () => {
    expect(() => growerPage(us, 'Nowhere Farm')).toThrow(/no site "Nowhere Farm"/);
  });
});
