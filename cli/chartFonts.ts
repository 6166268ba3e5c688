/**
 * The font files chart labels are drawn with: the workbook's pictures carry
 * their labels as this face's glyph outlines (outlinedText.ts) and the grower
 * PDF embeds the same face (growerPdf.ts), so the files are found here, on
 * disk, by path; a machine with none of them gets a message that says which
 * package to install instead of a chart with blank labels.
 */
import { existsSync } from 'node:fs';

/** Sans fonts looked for, in order of preference (Debian's fonts-dejavu-core, fonts-liberation). */
const fontCandidates = [
  '/usr/share/fonts/truetype/dejavu/DejaVuSans.ttf',
  '/usr/share/fonts/truetype/dejavu/DejaVuSans-Bold.ttf',
  '/usr/share/fonts/truetype/liberation/LiberationSans-Regular.ttf',
  '/usr/share/fonts/truetype/liberation/LiberationSans-Bold.ttf',
  '/usr/share/fonts/TTF/DejaVuSans.ttf',
  '/usr/share/fonts/TTF/DejaVuSans-Bold.ttf',
  '/Library/Fonts/Arial.ttf',
  '/System/Library/Fonts/Supplemental/Arial.ttf',
  'C:\\Windows\\Fonts\\arial.ttf',
  'C:\\Windows\\Fonts\\arialbd.ttf',
];

let cachedFonts: string[] | null = null;

/**
 * The font files the PNG step will use.
 * @returns absolute paths of the sans fonts found on this machine
 * @throws {Error} when none is found, naming the package that provides one
 */
export function chartFontFiles(): string[] {
  if (cachedFonts) return cachedFonts;
  const present = fontCandidates.filter((f) => existsSync(f));
  // One family, regular and bold: the labels use no other.
  const family = present.length ? familyOf(present[0]) : '';
  const found = present.filter((f) => familyOf(f) === family);
  if (found.length === 0) {
    throw new Error(
      'No font for chart labels was found (looked for DejaVu Sans, Liberation Sans, Arial). ' +
        'Install one, e.g. "apt-get install fonts-dejavu-core" on Debian or Ubuntu, and run again.',
    );
  }
  cachedFonts = found;
  return found;
}

/**
 * The family a candidate font file belongs to.
 * @param file - a path from fontCandidates
 * @returns "DejaVu Sans", "Liberation Sans" or "Arial"
 */
function familyOf(file: string): string {
  if (/dejavu/i.test(file)) return 'DejaVu Sans';
  if (/liberation/i.test(file)) return 'Liberation Sans';
  return 'Arial';
}
