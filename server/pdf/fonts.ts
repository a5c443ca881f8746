import fs from 'node:fs';
import { createRequire } from 'node:module';
import * as fontkit from 'fontkit';

const require = createRequire(import.meta.url);

/**
 * The PDF's fonts: Inter as full TTFs from npm (@expo-google-fonts/inter). Unlike the web
 * subsets they carry every sign the schedules need: Ω, ≥, ✓, ✗, Δ, ², µ, ’ (checked glyph by
 * glyph in tests/server/pdf/render-job-pdf.test.ts).
 */
export const fontFiles = {
  regular: '@expo-google-fonts/inter/400Regular/Inter_400Regular.ttf',
  medium: '@expo-google-fonts/inter/500Medium/Inter_500Medium.ttf',
  bold: '@expo-google-fonts/inter/700Bold/Inter_700Bold.ttf',
} as const;

export type FontName = keyof typeof fontFiles;

export function fontPath(name: FontName): string {
  return require.resolve(fontFiles[name]);
}

let parsed: Record<FontName, fontkit.Font> | undefined;

/**
 * The fonts parsed once per process. Given a file or bytes, pdfkit parses the font again for
 * every document (≈100 ms per face here); given the parsed font it only makes the document's
 * own subset, so repeated issues stay fast and the output is the same.
 */
export function parsedFonts(): Record<FontName, fontkit.Font> {
  parsed ??= {
    regular: fontkit.create(fs.readFileSync(fontPath('regular'))),
    medium: fontkit.create(fs.readFileSync(fontPath('medium'))),
    bold: fontkit.create(fs.readFileSync(fontPath('bold'))),
  };
  return parsed;
}

/**
 * Parses the fonts and shapes a line with each, so the tables the layout engine reads lazily
 * (character map, substitutions, positioning) are ready before the first issue. The server
 * calls it once after it starts listening.
 */
export function warmUpFonts(): void {
  const sample = 'Schedule of test results 0123456789 .,:;()/-–— >200 N/A LIM ✓ ✗ Ω MΩ mm² IΔn R1+R2 Zs Ipf ’';
  for (const font of Object.values(parsedFonts())) font.layout(sample);
}
