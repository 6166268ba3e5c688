/**
 * How a grower page is laid out on paper, as a list of blocks from top to
 * bottom with sizes in points: the PDF writer (cli/, pdfkit) only draws what
 * this says. Paper is Letter (8.5 × 11 in) with US units and A4 otherwise;
 * sizes from ISO 216 (A4 210 × 297 mm) and ANSI/ASME Y14.1 (Letter), at 72 pt
 * per inch.
 */
import type { GrowerFact, GrowerPage } from './growerPage';

export type PageBlock =
  | { kind: 'text'; text: string; sizePt: number; bold: boolean; color: string; gapAfterPt: number }
  | { kind: 'facts'; rows: GrowerFact[]; sizePt: number; gapAfterPt: number }
  | {
      kind: 'box';
      title: string;
      lines: string[];
      sizePt: number;
      fill: string;
      stroke: string;
      gapAfterPt: number;
    }
  | { kind: 'chart'; maxHeightPt: number; gapAfterPt: number };

export interface PageLayout {
  paper: 'letter' | 'a4';
  widthPt: number;
  heightPt: number;
  marginPt: number;
  blocks: PageBlock[];
  /** Small print at the bottom margin. */
  footer: string;
}

/** Page sizes in points (1/72 in). */
export const PAPER_SIZES_PT = {
  letter: { widthPt: 612, heightPt: 792 },
  a4: { widthPt: (210 / 25.4) * 72, heightPt: (297 / 25.4) * 72 },
} as const;

/**
 * Lays out one grower page.
 * @param page - the structured page
 * @param withChart - leave room for the site's chart picture
 * @returns the blocks and the paper, sizes in points
 * @example
 * growerPageLayout(page, true).widthPt // 612 for Letter
 */
export function growerPageLayout(page: GrowerPage, withChart: boolean): PageLayout {
  const size = PAPER_SIZES_PT[page.paper];
  const dark = '#111111';
  const grey = '#555555';
  const blocks: PageBlock[] = [
    {
      kind: 'text',
      text: page.heading.toUpperCase(),
      sizePt: 10,
      bold: true,
      color: grey,
      gapAfterPt: 2,
    },
    {
      kind: 'text',
      text: `${page.subject} · ${page.cropLabel}`,
      sizePt: 18,
      bold: true,
      color: dark,
      gapAfterPt: 10,
    },
    {
      kind: 'text',
      // A blank field prints as a line to write on, so a page printed before the names are typed
      // can still be filled in by hand.
      text: page.addressedTo.map((f) => `${f.label}: ${f.value || '_______________'}`).join('    '),
      sizePt: 9.5,
      bold: false,
      color: grey,
      gapAfterPt: 8,
    },
    {
      kind: 'text',
      text: page.recommendation,
      sizePt: 24,
      bold: true,
      color: '#1f5fa8',
      gapAfterPt: 2,
    },
  ];
  if (page.productRecommendation) {
    blocks.push({
      kind: 'text',
      text: page.productRecommendation,
      sizePt: 13,
      bold: false,
      color: dark,
      gapAfterPt: 6,
    });
  }
  if (page.facts.length)
    blocks.push({ kind: 'facts', rows: page.facts, sizePt: 11, gapAfterPt: 8 });
  blocks.push({
    kind: 'text',
    text: 'How sure is this?',
    sizePt: 12,
    bold: true,
    color: dark,
    gapAfterPt: 2,
  });
  blocks.push({
    kind: 'text',
    text: page.certainty.text,
    sizePt: 10.5,
    bold: false,
    color: dark,
    gapAfterPt: 8,
  });
  if (withChart) blocks.push({ kind: 'chart', maxHeightPt: 230, gapAfterPt: 8 });
  blocks.push({
    kind: 'text',
    text: 'Prices assumed',
    sizePt: 12,
    bold: true,
    color: dark,
    gapAfterPt: 2,
  });
  blocks.push({ kind: 'facts', rows: page.prices, sizePt: 10, gapAfterPt: 8 });
  blocks.push({
    kind: 'text',
    text: 'What this rests on',
    sizePt: 12,
    bold: true,
    color: dark,
    gapAfterPt: 2,
  });
  for (const b of page.basis)
    blocks.push({ kind: 'text', text: b, sizePt: 10, bold: false, color: dark, gapAfterPt: 2 });
  if (page.warnings.length) {
    blocks.push({
      kind: 'box',
      title: 'Please note',
      lines: page.warnings,
      sizePt: 10,
      fill: '#fff4e5',
      stroke: '#d9731a',
      gapAfterPt: 8,
    });
  } else {
    blocks.push({ kind: 'text', text: '', sizePt: 4, bold: false, color: dark, gapAfterPt: 4 });
  }
  blocks.push({
    kind: 'box',
    title: 'Cautions',
    lines: [...page.cautions],
    sizePt: 10,
    fill: '#eef2f6',
    stroke: '#5b6770',
    gapAfterPt: 0,
  });
  return { paper: page.paper, ...size, marginPt: 50, blocks, footer: page.footer };
}
