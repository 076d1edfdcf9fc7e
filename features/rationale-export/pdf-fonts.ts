/**
 * Fonts for the PDF: Inter as static `.woff` files from `@fontsource/inter` (react-pdf reads
 * neither woff2 nor variable fonts). The latin subset lacks Greek letters (Ω) and latin-ext
 * lacks nothing we need but accented names; the three subsets are registered as separate
 * families and given to react-pdf as a fallback list.
 */
import path from 'node:path';
import { Font } from '@react-pdf/renderer';

/** Fallback list to use as `fontFamily` everywhere in the document. */
export const PDF_FONT_FAMILIES = ['Inter', 'InterLatinExt', 'InterGreek'];

const SUBSETS: Array<[family: string, subset: string]> = [
  ['Inter', 'latin'],
  ['InterLatinExt', 'latin-ext'],
  ['InterGreek', 'greek'],
];

/** Absolute path of one static Inter file. */
export function interFontPath(subset: string, weight: 400 | 700, style: 'normal' | 'italic' = 'normal'): string {
  return path.join(process.cwd(), 'node_modules/@fontsource/inter/files', `inter-${subset}-${weight}-${style}.woff`);
}

let registered = false;

/** Registers the fonts once per process; turns hyphenation off. */
export function registerPdfFonts(): void {
  if (registered) return;
  for (const [family, subset] of SUBSETS) {
    Font.register({
      family,
      fonts: [
        { src: interFontPath(subset, 400), fontWeight: 400 },
        { src: interFontPath(subset, 700), fontWeight: 700 },
        { src: interFontPath(subset, 400, 'italic'), fontWeight: 400, fontStyle: 'italic' },
      ],
    });
  }
  // No hyphenation: it would split unit symbols, part values and hashes.
  Font.registerHyphenationCallback((word) => [word]);
  registered = true;
}
