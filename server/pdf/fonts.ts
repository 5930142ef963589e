import fs from 'node:fs';
import zlib from 'node:zlib';
import { createRequire } from 'node:module';
import path from 'node:path';
import fontkit from '@pdf-lib/fontkit';
import type { PDFDocument, PDFFont } from 'pdf-lib';

/**
 * Work Sans (SIL Open Font License) from the @fontsource/work-sans package. The .woff files are
 * unwrapped and embedded with subset: true: the .woff2 files give blank text in pdf-lib and subset: false gives
 * an invalid font (measured; see /work/shared/TOOLCHAIN.md).
 */
const require = createRequire(import.meta.url);
const filesDir = path.join(path.dirname(require.resolve('@fontsource/work-sans/package.json')), 'files');

const FILES = {
  regular: 'work-sans-latin-400-normal.woff',
  bold: 'work-sans-latin-600-normal.woff',
} as const;

/**
 * The PDF names: a six-letter tag + '+' marks a subset font (ISO 32000-1 §9.6.4). A fixed tag
 * instead of pdf-lib's random suffix keeps the bytes of a document reproducible.
 */
const NAMES = { regular: 'HDRMRG+WorkSans-Regular', bold: 'HDRMSB+WorkSans-SemiBold' } as const;

/**
 * WOFF 1.0 → the sfnt (TrueType) it wraps (W3C WOFF File Format 1.0, §3–5): the same tables,
 * inflated once. fontkit reads a WOFF table by inflating it on every access — the whole glyf table
 * for each glyph — which made a summary take a second; the unwrapped font embeds the same glyphs.
 */
export function woffToSfnt(woff: Uint8Array): Uint8Array {
  const src = Buffer.from(woff.buffer, woff.byteOffset, woff.byteLength);
  if (src.readUInt32BE(0) !== 0x774f4646) throw new Error('not a WOFF 1.0 file');
  const flavor = src.readUInt32BE(4);
  const numTables = src.readUInt16BE(12);
  const tables: { tag: number; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < numTables; i++) {
    const e = 44 + i * 20;
    const [tag, offset, compLength, origLength, checksum] = [0, 4, 8, 12, 16].map((k) => src.readUInt32BE(e + k));
    const raw = src.subarray(offset, offset + compLength);
    const data = compLength < origLength ? zlib.inflateSync(raw) : Buffer.from(raw);
    if (data.length !== origLength) throw new Error('WOFF table length mismatch');
    tables.push({ tag, checksum, data });
  }
  // the sfnt offset table's binary-search fields (OpenType spec, "Table directory")
  const maxPow2 = 2 ** Math.floor(Math.log2(numTables));
  const head = Buffer.alloc(12 + 16 * numTables);
  head.writeUInt32BE(flavor, 0);
  head.writeUInt16BE(numTables, 4);
  head.writeUInt16BE(maxPow2 * 16, 6);
  head.writeUInt16BE(Math.log2(maxPow2), 8);
  head.writeUInt16BE(numTables * 16 - maxPow2 * 16, 10);
  const parts: Buffer[] = [head];
  let offset = head.length;
  tables.forEach((t, i) => {
    const r = 12 + i * 16;
    head.writeUInt32BE(t.tag, r);
    head.writeUInt32BE(t.checksum, r + 4);
    head.writeUInt32BE(offset, r + 8);
    head.writeUInt32BE(t.data.length, r + 12);
    const padded = Buffer.alloc((t.data.length + 3) & ~3);
    t.data.copy(padded);
    parts.push(padded);
    offset += padded.length;
  });
  return new Uint8Array(Buffer.concat(parts));
}

let cache: { regular: Uint8Array; bold: Uint8Array } | null = null;
function fontBytes() {
  cache ??= {
    regular: woffToSfnt(fs.readFileSync(path.join(filesDir, FILES.regular))),
    bold: woffToSfnt(fs.readFileSync(path.join(filesDir, FILES.bold))),
  };
  return cache;
}

interface FontkitGlyph {
  id: number;
  advanceWidth: number;
}
interface FontkitFont {
  layout: (text: string, features?: unknown) => { glyphs: FontkitGlyph[]; positions: unknown[] };
  glyphForCodePoint: (cp: number) => FontkitGlyph;
}

/**
 * pdf-lib (1.17.1) asks fontkit to shape every string it draws or measures, and uses only the
 * glyphs. For Latin text with ligatures off, shaping is the cmap lookup; doing that lookup
 * directly (cached per character) gives the same glyphs at a fraction of the time.
 */
function useCmapLayout(font: PDFFont) {
  const fk = (font as unknown as { embedder: { font: FontkitFont } }).embedder?.font;
  if (!fk || typeof fk.glyphForCodePoint !== 'function') return;
  const byChar = new Map<number, FontkitGlyph>();
  fk.layout = (text: string) => {
    const glyphs: FontkitGlyph[] = [];
    for (const ch of text) {
      const cp = ch.codePointAt(0)!;
      let g = byChar.get(cp);
      if (!g) byChar.set(cp, (g = fk.glyphForCodePoint(cp)));
      glyphs.push(g);
    }
    return { glyphs, positions: [] };
  };
}

export interface Fonts {
  regular: PDFFont;
  bold: PDFFont;
}

export async function embedFonts(doc: PDFDocument): Promise<Fonts> {
  doc.registerFontkit(fontkit);
  const bytes = fontBytes();
  // ligatures off: a glyph per character, so widths measured per character equal what is drawn
  const features = { liga: false, clig: false, dlig: false };
  const [regular, bold] = await Promise.all([
    doc.embedFont(bytes.regular, { subset: true, customName: NAMES.regular, features }),
    doc.embedFont(bytes.bold, { subset: true, customName: NAMES.bold, features }),
  ]);
  useCmapLayout(regular);
  useCmapLayout(bold);
  return { regular, bold };
}
