// The part of fontkit (pdfkit's font engine, https://github.com/foliojs/fontkit) that
// outlinedText.ts uses; the package ships no types.
declare module 'fontkit' {
  /** A glyph outline in font units. */
  export interface Path {
    toSVG(): string;
    /** A copy moved by (x, y) font units. */
    translate(x: number, y: number): Path;
  }
  export interface Glyph {
    id: number;
    path: Path;
  }
  export interface GlyphRun {
    glyphs: Glyph[];
    positions: { xAdvance: number; xOffset: number; yOffset: number }[];
    advanceWidth: number;
  }
  export interface Font {
    unitsPerEm: number;
    layout(text: string): GlyphRun;
  }
  export function openSync(path: string): Font;
}
