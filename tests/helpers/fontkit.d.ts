/**
 * The little of fontkit (the font library pdfkit uses, installed with it) that the PDF test
 * reads: whether a font file maps a character to a glyph.
 */
declare module 'fontkit' {
  export interface Font {
    hasGlyphForCodePoint(codePoint: number): boolean;
  }
  export function openSync(path: string): Font | { fonts: Font[] };
}
