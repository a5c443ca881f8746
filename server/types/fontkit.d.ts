/**
 * The little of fontkit (the font engine pdfkit uses; pinned beside it) that Boardwalk calls:
 * parse a font file once, ask whether it maps a character to a glyph. pdfkit takes the parsed
 * font object as a font source as it is (it only needs `layout`).
 */
declare module 'fontkit' {
  export interface Font {
    hasGlyphForCodePoint(codePoint: number): boolean;
    layout(text: string): unknown;
  }
  export function create(buffer: Uint8Array, postscriptName?: string): Font;
  export function openSync(path: string): Font;
}
