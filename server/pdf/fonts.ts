import fs from 'node:fs';
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);

/**
 * The PDF's fonts: Inter as full TTFs from npm (@expo-google-fonts/inter). Unlike the web
 * subsets they carry every sign the schedules need: Ω, ≥, ✓, ✗, Δ, ², µ, ’ (checked glyph by
 * glyph in tests/server/pdf/render-job-pdf.test.ts). Read once per process.
 */
export const fontFiles = {
  regular: '@expo-google-fonts/inter/400Regular/Inter_400Regular.ttf',
  medium: '@expo-google-fonts/inter/500Medium/Inter_500Medium.ttf',
  bold: '@expo-google-fonts/inter/700Bold/Inter_700Bold.ttf',
} as const;

export type FontName = keyof typeof fontFiles;

let cache: Record<FontName, Buffer> | undefined;

export function fontBytes(): Record<FontName, Buffer> {
  cache ??= {
    regular: fs.readFileSync(require.resolve(fontFiles.regular)),
    medium: fs.readFileSync(require.resolve(fontFiles.medium)),
    bold: fs.readFileSync(require.resolve(fontFiles.bold)),
  };
  return cache;
}

export function fontPath(name: FontName): string {
  return require.resolve(fontFiles[name]);
}
