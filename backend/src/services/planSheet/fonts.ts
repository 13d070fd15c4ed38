import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import type { jsPDF } from 'jspdf';

/** Font family name the sheets register Lato under. */
export const SHEET_FONT = 'Lato';

const require = createRequire(import.meta.url);
const LATO_DIR = path.dirname(require.resolve('@expo-google-fonts/lato/package.json'));
const FILES = { normal: '400Regular/Lato_400Regular.ttf', bold: '700Bold/Lato_700Bold.ttf' } as const;

let cached: Record<keyof typeof FILES, string> | null = null;

/** Lato Regular and Bold TTFs as base64, read once from the installed font package (fixed paths only). */
function latoBase64(): Record<keyof typeof FILES, string> {
  if (!cached) {
    cached = {
      normal: readFileSync(path.join(LATO_DIR, FILES.normal)).toString('base64'),
      bold: readFileSync(path.join(LATO_DIR, FILES.bold)).toString('base64'),
    };
  }
  return cached;
}

/** Embeds Lato Regular and Bold in a document (VFS + addFont) and selects Regular. */
export function embedLato(doc: jsPDF): void {
  const fonts = latoBase64();
  for (const style of ['normal', 'bold'] as const) {
    const file = `Lato-${style}.ttf`;
    doc.addFileToVFS(file, fonts[style]);
    doc.addFont(file, SHEET_FONT, style, undefined, 'Identity-H');
  }
  doc.setFont(SHEET_FONT, 'normal');
}

/**
 * Code points Lato 2 (Regular and Bold) maps, as inclusive ranges; read from the font's cmap with
 * fontconfig's `fc-query -f '%{charset}'` (a test checks this table against that tool).
 */
export const LATO_RANGES: ReadonlyArray<readonly [number, number]> = [
  [0x20, 0x7e], [0xa0, 0xff], [0x104, 0x107], [0x118, 0x119], [0x131, 0x131], [0x141, 0x144], [0x152, 0x153],
  [0x15a, 0x15b], [0x160, 0x161], [0x178, 0x17e], [0x192, 0x192], [0x2c6, 0x2c7], [0x2c9, 0x2c9], [0x2d8, 0x2dd],
  [0x3c0, 0x3c0], [0x2013, 0x2014], [0x2018, 0x201a], [0x201c, 0x201e], [0x2020, 0x2022], [0x2026, 0x2026],
  [0x2030, 0x2030], [0x2039, 0x203a], [0x2044, 0x2044], [0x20ac, 0x20ac], [0x2122, 0x2122], [0x2126, 0x2126],
  [0x2202, 0x2202], [0x2206, 0x2206], [0x220f, 0x220f], [0x2211, 0x2212], [0x221a, 0x221a], [0x221e, 0x221e],
  [0x222b, 0x222b], [0x2248, 0x2248], [0x2260, 0x2260], [0x2264, 0x2265], [0x25ca, 0x25ca], [0x2669, 0x2669],
  [0xfb01, 0xfb02],
];

/** True when Lato has a glyph for the code point. */
export function latoHas(codePoint: number): boolean {
  for (const [a, b] of LATO_RANGES) if (codePoint >= a && codePoint <= b) return true;
  return false;
}

const PRINTABLE_ASCII = /^[\x20-\x7e]*$/;

/**
 * Text fit for the sheet font: characters Lato lacks (which jsPDF would drop without a word) become
 * "?", tabs and line breaks become spaces.
 */
export function sheetText(s: string): string {
  if (PRINTABLE_ASCII.test(s)) return s; // Lato has all of it: nothing to replace
  let out = '';
  for (const ch of s.replace(/[\t\r\n]+/g, ' ')) out += latoHas(ch.codePointAt(0)!) ? ch : '?';
  return out;
}
