/**
 * A small page-layout engine over pdf-lib: a cursor that moves down the page, paragraphs that
 * wrap, tables that break across pages with their header repeated, and a header and footer drawn
 * on every page once the page count is known. Everything drawn is measured first, so no text
 * leaves the page margins (the test checks it with pdftotext -bbox).
 */
import { rgb, type PDFDocument, type PDFFont, type PDFPage, type RGB } from 'pdf-lib';
import type { Fonts } from './fonts';

export const COLORS = {
  ink: rgb(0.11, 0.13, 0.16),
  muted: rgb(0.38, 0.41, 0.45),
  rule: rgb(0.78, 0.8, 0.83),
  band: rgb(0.93, 0.95, 0.96),
  accent: rgb(0.07, 0.33, 0.4),
  fail: rgb(0.66, 0.12, 0.1),
  failBand: rgb(0.99, 0.92, 0.91),
};

/** Page sizes in points (1/72 in): US Letter 8.5 × 11 in; ISO 216 A4 210 × 297 mm. */
export const PAGE_SIZES = { letter: [612, 792], a4: [595.28, 841.89] } as const;

/** Margins in points: 0.7 in at the sides (a choice, room for binding), the header and footer bands. */
export const MARGIN = { side: 50, top: 72, bottom: 60, headerBaseline: 40, footerBaseline: 30 } as const;

type FontKey = keyof Fonts;

export interface Column {
  header: string;
  /** a share of the table width; the shares are normalised */
  width: number;
  align?: 'left' | 'right';
  /** wrap onto more lines instead of shortening with an ellipsis */
  wrap?: boolean;
}

export interface RowStyle {
  bold?: boolean;
  fail?: boolean;
}

export class Layout {
  readonly pages: PDFPage[] = [];
  page!: PDFPage;
  y = 0;
  readonly width: number;
  readonly height: number;
  private readonly widthCache = new Map<PDFFont, Map<string, number>>();
  private readonly charsets = new Map<PDFFont, Set<number>>();
  /** Characters the embedded fonts cannot show, printed as "?"; the summary lists them. */
  readonly missing = new Set<string>();

  constructor(
    readonly doc: PDFDocument,
    readonly fonts: Fonts,
    size: readonly [number, number],
  ) {
    [this.width, this.height] = size;
    for (const f of [fonts.regular, fonts.bold]) this.charsets.set(f, new Set(f.getCharacterSet()));
    this.newPage();
  }

  get left() {
    return MARGIN.side;
  }
  get right() {
    return this.width - MARGIN.side;
  }
  get contentWidth() {
    return this.right - this.left;
  }
  get bottom() {
    return MARGIN.bottom;
  }

  newPage() {
    this.page = this.doc.addPage([this.width, this.height]);
    this.pages.push(this.page);
    this.y = this.height - MARGIN.top;
  }

  /** True while nothing has been drawn below the top margin of the current page. */
  get atPageTop() {
    return this.y >= this.height - MARGIN.top - 0.01;
  }

  /** Starts a new page unless `height` points still fit above the bottom margin. */
  ensure(height: number) {
    if (this.y - height < this.bottom) this.newPage();
  }

  gap(points: number) {
    this.y -= points;
  }

  /** Characters the embedded font has; others get a plain stand-in (the latin subset lacks ≥, →, Σ, ρ, Δ). */
  clean(text: string, font: PDFFont = this.fonts.regular): string {
    const set = this.charsets.get(font)!;
    let out = '';
    for (const ch of text.replace(/\s+/g, ' ')) {
      const cp = ch.codePointAt(0)!;
      if (set.has(cp)) out += ch;
      else if (SUBSTITUTES[ch] !== undefined) out += SUBSTITUTES[ch];
      else {
        this.missing.add(ch);
        out += '?';
      }
    }
    return out;
  }

  measure(text: string, font: PDFFont, size: number): number {
    let perFont = this.widthCache.get(font);
    if (!perFont) this.widthCache.set(font, (perFont = new Map()));
    let units = 0;
    for (const ch of text) {
      let w = perFont.get(ch);
      if (w === undefined) {
        w = font.widthOfTextAtSize(ch, 1000);
        perFont.set(ch, w);
      }
      units += w;
    }
    return (units * size) / 1000;
  }

  /** The longest start of `text` that fits in `width`, with an ellipsis when shortened. */
  fit(text: string, font: PDFFont, size: number, width: number): string {
    if (this.measure(text, font, size) <= width) return text;
    const chars = [...text];
    let lo = 0;
    let hi = chars.length;
    while (lo < hi) {
      const mid = Math.ceil((lo + hi) / 2);
      if (this.measure(chars.slice(0, mid).join('') + '…', font, size) <= width) lo = mid;
      else hi = mid - 1;
    }
    return chars.slice(0, lo).join('').trimEnd() + '…';
  }

  /**
   * Breaks `text` into lines no wider than `width`: at spaces; a word longer than a whole line
   * breaks after a hyphen, dash or slash in it ("Pressure-" / "reducing"); only a part longer than
   * a whole line is cut, and the cut is marked with a hyphen.
   */
  wrap(text: string, font: PDFFont, size: number, width: number): string[] {
    const fits = (s: string) => this.measure(s, font, size) <= width;
    const lines: string[] = [];
    let line = '';
    for (const word of text.split(' ')) {
      const candidate = line ? `${line} ${word}` : word;
      if (fits(candidate)) {
        line = candidate;
        continue;
      }
      if (fits(word)) {
        if (line) lines.push(line);
        line = word;
        continue;
      }
      // a word longer than a whole line: the parts of the word, each ending at its hyphens: "Pressure-reducing" → "Pressure-", "reducing"
      const parts = word.match(/[^-‐–—/]+[-‐–—/]*|[-‐–—/]+/g) ?? [word];
      let joiner = line ? ' ' : '';
      for (const part of parts) {
        const joined = `${line}${joiner}${part}`;
        joiner = '';
        if (fits(joined)) {
          line = joined;
          continue;
        }
        if (line) lines.push(line);
        let rest = part;
        while (!fits(rest)) {
          const chars = [...rest];
          let n = chars.length - 1;
          while (n > 1 && !fits(`${chars.slice(0, n).join('')}-`)) n--;
          lines.push(`${chars.slice(0, n).join('')}-`);
          rest = chars.slice(n).join('');
        }
        line = rest;
      }
    }
    if (line || !lines.length) lines.push(line);
    return lines;
  }

  /** Draws one line at (x, baseline); the caller has measured it. */
  draw(text: string, x: number, baseline: number, opts: { font?: FontKey; size?: number; color?: RGB } = {}) {
    const font = this.fonts[opts.font ?? 'regular'];
    const clean = this.clean(text, font);
    if (!clean) return;
    this.page.drawText(clean, { x, y: baseline, size: opts.size ?? 9, font, color: opts.color ?? COLORS.ink });
  }

  /** A wrapped paragraph at the cursor. */
  paragraph(text: string, opts: { font?: FontKey; size?: number; color?: RGB; indent?: number; after?: number } = {}) {
    const size = opts.size ?? 9;
    const font = this.fonts[opts.font ?? 'regular'];
    const indent = opts.indent ?? 0;
    const leading = size * 1.35;
    for (const line of this.wrap(this.clean(text, font), font, size, this.contentWidth - indent)) {
      this.ensure(leading);
      this.y -= leading;
      this.draw(line, this.left + indent, this.y + size * 0.25, { ...opts, size });
    }
    this.y -= opts.after ?? 3;
  }

  /** A section heading, kept on the page with at least `keep` points of what follows. */
  heading(text: string, level: 1 | 2 = 1, keep = 60) {
    const size = level === 1 ? 13 : 10.5;
    this.ensure(size * 2 + keep);
    this.y -= level === 1 ? 10 : 6;
    this.y -= size * 1.2;
    this.draw(text, this.left, this.y + size * 0.2, { font: 'bold', size, color: level === 1 ? COLORS.accent : COLORS.ink });
    if (level === 1) {
      this.page.drawLine({ start: { x: this.left, y: this.y - 3 }, end: { x: this.right, y: this.y - 3 }, thickness: 0.8, color: COLORS.accent });
      this.y -= 8;
    } else this.y -= 4;
  }

  /** Label–value lines (the value wraps in its column). */
  keyValues(rows: [string, string][], opts: { labelWidth?: number; size?: number } = {}) {
    const size = opts.size ?? 9;
    const labelWidth = opts.labelWidth ?? 150;
    const leading = size * 1.35;
    for (const [label, value] of rows) {
      const lines = this.wrap(this.clean(value), this.fonts.regular, size, this.contentWidth - labelWidth);
      this.ensure(leading * Math.min(lines.length, 3));
      lines.forEach((line, i) => {
        this.ensure(leading);
        this.y -= leading;
        if (i === 0)
          this.draw(this.fit(this.clean(label, this.fonts.bold), this.fonts.bold, size, labelWidth - 8), this.left, this.y + size * 0.25, {
            font: 'bold',
            size,
            color: COLORS.muted,
          });
        this.draw(line, this.left + labelWidth, this.y + size * 0.25, { size });
      });
    }
    this.y -= 3;
  }

  /**
   * A table that breaks across pages: the header row is repeated at the top of every page it
   * continues on, and no row is split.
   */
  table(columns: Column[], rows: { cells: string[]; style?: RowStyle }[], opts: { size?: number; continued?: string } = {}) {
    const size = opts.size ?? 7.5;
    const pad = 2.5;
    const leading = size * 1.25;
    const total = columns.reduce((s, c) => s + c.width, 0);
    const widths = columns.map((c) => (c.width / total) * this.contentWidth);
    const xs = widths.map((_, i) => this.left + widths.slice(0, i).reduce((s, w) => s + w, 0));
    const { regular, bold } = this.fonts;

    const layoutRow = (cells: string[], font: PDFFont, wrapAll = false) =>
      cells.map((cell, i) => {
        const inner = widths[i] - 2 * pad;
        const text = this.clean(cell ?? '', font);
        return columns[i].wrap || wrapAll ? this.wrap(text, font, size, inner) : [this.fit(text, font, size, inner)];
      });
    // header cells always wrap: a unit goes onto a second line rather than being cut
    const headerCells = layoutRow(
      columns.map((c) => c.header),
      bold,
      true,
    );
    const headerHeight = Math.max(...headerCells.map((l) => l.length)) * leading + 2 * pad;

    const drawRow = (cells: string[][], font: PDFFont, height: number, fill?: RGB, color: RGB = COLORS.ink) => {
      if (fill) this.page.drawRectangle({ x: this.left, y: this.y - height, width: this.contentWidth, height, color: fill });
      cells.forEach((lines, i) => {
        lines.forEach((line, k) => {
          const w = this.measure(line, font, size);
          const x = columns[i].align === 'right' ? xs[i] + widths[i] - pad - w : xs[i] + pad;
          const baseline = this.y - pad - (k + 1) * leading + size * 0.3;
          if (line) this.page.drawText(line, { x, y: baseline, size, font, color });
        });
      });
      this.y -= height;
      this.page.drawLine({ start: { x: this.left, y: this.y }, end: { x: this.right, y: this.y }, thickness: 0.4, color: COLORS.rule });
    };
    const drawHeader = (continued: boolean) => {
      if (continued && opts.continued) {
        this.y -= size * 1.6;
        this.draw(`${opts.continued} (continued)`, this.left, this.y + size * 0.3, { font: 'bold', size, color: COLORS.muted });
      }
      drawRow(headerCells, bold, headerHeight, COLORS.band, COLORS.ink);
    };

    const laidOut = rows.map((r) => {
      const font = r.style?.bold ? bold : regular;
      const cells = layoutRow(r.cells, font);
      return { cells, font, style: r.style, height: Math.max(...cells.map((l) => l.length)) * leading + 2 * pad };
    });
    // the header and at least one row together
    this.ensure(headerHeight + (laidOut[0]?.height ?? 0));
    drawHeader(false);
    for (const row of laidOut) {
      if (this.y - row.height < this.bottom) {
        this.newPage();
        drawHeader(true);
      }
      drawRow(row.cells, row.font, row.height, row.style?.fail ? COLORS.failBand : undefined, row.style?.fail ? COLORS.fail : COLORS.ink);
    }
    this.y -= 6;
  }

  /**
   * Header and footer of every page, drawn last because they print the page count. Each text is
   * fitted into its share of the width.
   */
  frame(header: { left: string; right: string; left2?: string; right2?: string }, footer: { left: string; middle: string }) {
    const size = 7.5;
    const { regular, bold } = this.fonts;
    const n = this.pages.length;
    this.pages.forEach((page, i) => {
      const put = (text: string, font: PDFFont, x: number, y: number, maxWidth: number, align: 'left' | 'right' | 'center' = 'left') => {
        const t = this.fit(this.clean(text, font), font, size, maxWidth);
        const w = this.measure(t, font, size);
        const at = align === 'right' ? x + maxWidth - w : align === 'center' ? x + (maxWidth - w) / 2 : x;
        page.drawText(t, { x: at, y, size, font, color: COLORS.muted });
      };
      const second = header.left2 !== undefined || header.right2 !== undefined;
      const top = this.height - MARGIN.headerBaseline;
      const half = this.contentWidth / 2 - 6;
      put(header.left, bold, this.left, top, half);
      put(header.right, regular, this.left + half + 12, top, half, 'right');
      if (second) {
        // the permit line: the number and code get the wider share
        const wide = this.contentWidth * 0.6 - 6;
        put(header.left2 ?? '', regular, this.left, top - 10, wide);
        put(header.right2 ?? '', regular, this.left + wide + 12, top - 10, this.contentWidth - wide - 12, 'right');
      }
      // the second line sits between the first and the top margin (72 pt): rule at 56 pt from the top
      const rule = second ? top - 16 : top - 6;
      page.drawLine({ start: { x: this.left, y: rule }, end: { x: this.right, y: rule }, thickness: 0.5, color: COLORS.rule });
      const foot = MARGIN.footerBaseline;
      page.drawLine({ start: { x: this.left, y: foot + 10 }, end: { x: this.right, y: foot + 10 }, thickness: 0.5, color: COLORS.rule });
      const third = this.contentWidth / 3;
      put(footer.left, regular, this.left, foot, third * 1.2 - 6);
      put(footer.middle, regular, this.left + third * 1.2, foot, third * 1.1 - 6, 'center');
      put(`Page ${i + 1} of ${n}`, bold, this.left + third * 2.3, foot, third * 0.7, 'right');
    });
  }
}

const SUBSTITUTES: Record<string, string> = {
  '≥': '>=',
  '≤': '<=',
  '→': '->',
  '←': '<-',
  Σ: 'sum ',
  ρ: 'rho',
  Δ: 'delta ',
  β: 'beta',
  '≈': '~',
  '√': 'sqrt',
  '∝': 'proportional to',
  '✓': 'ok',
  '\u00a0': ' ',
};
