import fs from 'node:fs';
import path from 'node:path';

/**
 * The report's fonts: Inter, shipped with the app in ./fonts (from @fontsource/inter, SIL Open Font
 * License in ./fonts/LICENSE-inter.txt), so nothing is fetched when a report is made. Fontsource cuts
 * Inter into subsets by script; the Latin file has µ, °, ± and the typographic minus, the Greek file
 * has Ω, η and μ. Text is written in runs, each with the file that has its letters.
 */

export const FONT = {
  regular: 'Inter',
  bold: 'Inter-Bold',
  greek: 'InterGreek',
  greekBold: 'InterGreek-Bold',
} as const;

export type FontName = (typeof FONT)[keyof typeof FONT];

const FILES: Record<FontName, string> = {
  Inter: 'inter-latin-400-normal.woff',
  'Inter-Bold': 'inter-latin-700-normal.woff',
  InterGreek: 'inter-greek-400-normal.woff',
  'InterGreek-Bold': 'inter-greek-700-normal.woff',
};

/** Read from the project root, where `next start` and jest both run (bundled code has no stable __dirname). */
const FONT_DIR = path.join(process.cwd(), 'src', 'lib', 'report', 'fonts');

const loaded = new Map<FontName, Buffer>();

export function fontData(name: FontName): Buffer {
  let data = loaded.get(name);
  if (!data) {
    data = fs.readFileSync(path.join(FONT_DIR, FILES[name]));
    loaded.set(name, data);
  }
  return data;
}

/** Anything with pdfkit's registerFont. */
export interface FontRegistry {
  registerFont(name: string, src: Buffer): unknown;
}

export function registerReportFonts(doc: FontRegistry): void {
  for (const name of Object.values(FONT)) doc.registerFont(name, fontData(name));
}

/** Greek and Coptic, and Greek Extended: the code points the Greek file covers. */
const GREEK = /[\u0370-\u03ff\u1f00-\u1fff]/u;

/** Symbols in neither file, written the way a plain-text note would write them. */
const STAND_INS: Record<string, string> = { '\u2264': '<=', '\u2265': '>=', '\u2248': '~', '\u221a': 'sqrt ' };

export interface TextRun {
  text: string;
  greek: boolean;
}

/** The text cut into runs of Latin and Greek letters, in order; "" gives no run. */
export function textRuns(text: string): TextRun[] {
  const runs: TextRun[] = [];
  for (const char of text) {
    const printable = STAND_INS[char] ?? char;
    const greek = GREEK.test(char);
    const last = runs[runs.length - 1];
    if (last && last.greek === greek) last.text += printable;
    else runs.push({ text: printable, greek });
  }
  return runs;
}

export const fontFor = (greek: boolean, bold: boolean): FontName => (greek ? (bold ? FONT.greekBold : FONT.greek) : bold ? FONT.bold : FONT.regular);
