// The part of fontkit (pdfkit's font engine, https://github.com/foliojs/fontkit) that
// outlinedText.ts uses; the package ships no types.
declare module 'fontkit' {
  export interface Glyph {
    id: number;
    path: { toSVG(): string };
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
