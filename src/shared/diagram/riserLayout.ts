/**
 * The riser diagram as geometry, for the issued summary's PDF and for the screen: the piping drawn
 * schematically with heights to scale (each node at its elevation) and branches spread sideways
 * in columns; the floors (or, where the document names none, the levels the risers reach) as
 * lines with their names and elevations; each segment labelled with its size and material; each
 * device as a tagged box with its name. Pure (no DOM, no PDF): `riserDiagram` lays it out in
 * columns × elevation units; `fitRiserDiagram` scales it onto sheets of paper, tiling with match
 * marks when one sheet would make it too small to read; `itemBox` is every drawn item's bounding
 * box, which the tests hold inside the sheet's margins.
 */
import { expandBuilding } from '../../engine/building/expand';
import type { Analysis } from '../../engine/analysis/types';
import type { SystemDocument } from '../../engine/model/schema';
import { MATERIALS } from '../../engine/catalog/materials';
import { withUnit } from '../format/quantity';

export type DeviceTag = 'M' | 'BFP' | 'PRV' | 'BP' | 'WH' | 'ET' | 'D';

/** Headroom's own short tags for the devices a reviewer looks for on a riser diagram. */
export const DEVICE_TAGS: Record<string, DeviceTag> = {
  meter: 'M',
  'backflow-preventer': 'BFP',
  prv: 'PRV',
  'booster-pump': 'BP',
  'water-heater': 'WH',
};
export const DEVICE_TAG_WORDS: Record<DeviceTag, string> = {
  M: 'meter',
  BFP: 'backflow preventer',
  PRV: 'pressure-reducing valve',
  BP: 'booster pump',
  WH: 'water heater',
  ET: 'expansion tank',
  D: 'other in-line device',
};

export interface Point {
  x: number;
  y: number;
}
export interface DiagramPipe {
  segmentId: string;
  name: string;
  /** "1-1/4 Copper L": the nominal size and the material's short name */
  label: string;
  from: Point;
  to: Point;
  vertical: boolean;
}
export interface DiagramDevice {
  deviceId: string;
  tag: DeviceTag;
  label: string;
  at: Point;
  floor: string;
}
export interface DiagramLevel {
  name: string;
  elevation: number;
}
export interface DiagramFixture {
  fixtureId: string;
  label: string;
  at: Point;
  floor: string;
}
/** Where a pressure zone begins: at its PRV or booster (analysis/zones.ts), labelled in words, not by colour. */
export interface DiagramZoneBoundary {
  zoneId: string;
  /** "Zone 2" */
  short: string;
  /** "Zone 2 — PRV-2 (set 65 psi)" */
  name: string;
  at: Point;
  floor: string;
}
/** x in columns, y in the document's length unit (elevation). */
export interface RiserDiagram {
  lengthUnit: string;
  columns: number;
  minElevation: number;
  maxElevation: number;
  levels: DiagramLevel[];
  pipes: DiagramPipe[];
  devices: DiagramDevice[];
  fixtures: DiagramFixture[];
  /** Zone boundaries (none for a system with one zone, or an analysis stored before zones). */
  zones: DiagramZoneBoundary[];
}

/** A segment is drawn as a riser when it climbs or drops at least this much: 2 m or 6.5 ft, under a storey (2.4 m and more, common practice) and over a fixture drop. */
const RISER_MIN_RISE = { SI: 2, US: 6.5 } as const;

function shortMaterial(id: string | undefined): string {
  if (!id) return 'custom pipe';
  const label = MATERIALS[id as keyof typeof MATERIALS]?.label ?? id;
  return label
    .replace(/\s*\(.*\)\s*$/, '')
    .replace(/^Copper tube, Type (\w)$/, 'Cu $1')
    .replace(/ tubing/, '')
    .replace(/, /g, ' ');
}

function tagOf(kind: string, label: string): DeviceTag {
  if (/expansion tank/i.test(label)) return 'ET';
  return DEVICE_TAGS[kind] ?? 'D';
}

/**
 * Lays the piping out: every node at its elevation; a riser segment keeps its column, a branch
 * takes the next free column of its level (levels are reused up the building, so a typical floor
 * does not push the next one sideways).
 */
export function riserDiagram(doc: SystemDocument, a: Analysis): RiserDiagram {
  const expanded = expandBuilding(doc) as SystemDocument;
  const docSeg = new Map(expanded.segments.map((s) => [s.id, s]));
  const elevation = new Map(a.nodes.map((n) => [n.id, n.elevation]));
  const nodeLabel = new Map(a.nodes.map((n) => [n.id, n.label]));
  const children = new Map<string, typeof a.segments>();
  for (const s of a.segments) children.set(s.from, [...(children.get(s.from) ?? []), s]);
  const minRise = RISER_MIN_RISE[a.unitSystem];
  const isRiser = (s: (typeof a.segments)[number]) => Math.abs(s.rise) >= minRise;

  // floors as the document names them, up to the highest the system reaches (a hot system that
  // shares the building's floors but stops below the roof shows no empty roof level); else the
  // levels where risers end
  const highest = Math.max(...a.nodes.map((n) => n.elevation));
  const floorsReached = [...doc.floors].sort((x, y) => x.elevation - y.elevation).filter((f, i) => i === 0 || f.elevation <= highest + 1e-6);
  const levels: DiagramLevel[] = doc.floors.length
    ? floorsReached.map((f) => ({ name: f.name, elevation: f.elevation }))
    : [
        ...new Map(
          [doc.source.nodeId, ...a.segments.filter(isRiser).map((s) => s.to)]
            .reverse()
            .map((id) => [Math.round((elevation.get(id) ?? 0) * 10) / 10, nodeLabel.get(id) ?? 'level']),
        ).entries(),
      ]
        .sort((x, y) => x[0] - y[0])
        .map(([e, name]) => ({ name, elevation: e }));
  const levelOf = (e: number): DiagramLevel | null => {
    let found: DiagramLevel | null = null;
    for (const l of levels) if (l.elevation <= e + 1e-6) found = l;
    return found;
  };
  // a branch's columns are shared by its level: one cursor per level
  const band = (e: number) => levelOf(e)?.elevation ?? Number.NEGATIVE_INFINITY;
  const cursor = new Map<number, number>();
  const x = new Map<string, number>();
  const order = (list: typeof a.segments) => [...list].sort((p, q) => Number(isRiser(q)) - Number(isRiser(p)));

  const place = (nodeId: string, col: number) => {
    x.set(nodeId, col);
    const b = band(elevation.get(nodeId) ?? 0);
    cursor.set(b, Math.max(cursor.get(b) ?? 0, col + 1));
    // branches first (so they take the columns next to the riser), then the riser straight up
    const kids = order(children.get(nodeId) ?? []).reverse();
    for (const s of kids) {
      if (isRiser(s)) {
        // a riser keeps its column; every level it passes keeps clear of it
        const lo = Math.min(elevation.get(s.from) ?? 0, elevation.get(s.to) ?? 0);
        const hi = Math.max(elevation.get(s.from) ?? 0, elevation.get(s.to) ?? 0);
        for (const l of levels)
          if (l.elevation >= lo - 1e-6 && l.elevation <= hi + 1e-6) cursor.set(l.elevation, Math.max(cursor.get(l.elevation) ?? 0, col + 1));
        place(s.to, col);
      } else {
        const cb = band(elevation.get(s.to) ?? 0);
        place(s.to, Math.max(cursor.get(cb) ?? 0, col + 1));
      }
    }
  };
  const sourceId = doc.source.nodeId;
  place(sourceId, 0);

  const pipes: DiagramPipe[] = a.segments
    .filter((s) => x.has(s.from) && x.has(s.to))
    .map((s) => {
      const d = docSeg.get(s.id);
      return {
        segmentId: s.id,
        name: s.label ?? s.id,
        label: `${d?.size ?? ''} ${shortMaterial(d?.material)}`.trim(),
        from: { x: x.get(s.from)!, y: elevation.get(s.from) ?? 0 },
        to: { x: x.get(s.to)!, y: elevation.get(s.to) ?? 0 },
        vertical: isRiser(s),
      };
    });
  const floorName = (e: number) => levelOf(e)?.name ?? 'below the lowest level';
  const devices: DiagramDevice[] = [];
  for (const s of a.segments) {
    if (!s.devices.length || !x.has(s.from)) continue;
    s.devices.forEach((dv, k) => {
      const dev = expanded.devices.find((v) => v.id === dv.deviceId);
      const e0 = elevation.get(s.from) ?? 0;
      const e1 = elevation.get(s.to) ?? 0;
      // spread along the segment: devices in series on one pipe sit one after another
      const t = (k + 1) / (s.devices.length + 1);
      const at = { x: x.get(s.from)! + (x.get(s.to)! - x.get(s.from)!) * t, y: e0 + (e1 - e0) * t };
      devices.push({ deviceId: dv.deviceId, tag: tagOf(dev?.kind ?? dv.kind, dv.label), label: dv.label, at, floor: floorName(at.y) });
    });
  }
  const fixtures: DiagramFixture[] = a.fixtures
    .filter((f) => x.has(f.nodeId))
    .map((f) => ({
      fixtureId: f.id,
      label: f.label,
      at: { x: x.get(f.nodeId)!, y: elevation.get(f.nodeId) ?? 0 },
      floor: floorName(elevation.get(f.nodeId) ?? 0),
    }));
  const deviceAt = new Map(devices.map((dv) => [dv.deviceId, dv]));
  const zones: DiagramZoneBoundary[] = [];
  for (const z of a.zones ?? []) {
    const dv = deviceAt.get(z.id);
    if (z.feed.kind === 'supply' || !dv) continue;
    zones.push({ zoneId: z.id, short: `Zone ${z.index}`, name: z.name, at: dv.at, floor: dv.floor });
  }
  const ys = [...elevation.values(), ...levels.map((l) => l.elevation)];
  return {
    lengthUnit: a.units.elevation,
    columns: Math.max(...x.values()) + 1,
    minElevation: Math.min(...ys),
    maxElevation: Math.max(...ys),
    levels,
    pipes,
    devices,
    fixtures,
    zones,
  };
}

// ---- onto paper

export type DrawItem =
  | { type: 'line'; x1: number; y1: number; x2: number; y2: number; weight: 'pipe' | 'riser' | 'level' | 'match' | 'zone' }
  | { type: 'text'; x: number; y: number; text: string; size: number; maxWidth: number; vertical?: boolean; bold?: boolean }
  | { type: 'box'; x: number; y: number; width: number; height: number; fixtureId?: string };

export interface Sheet {
  /** 1-based, in reading order; "A2" style names come from row and column */
  number: number;
  row: number;
  column: number;
  items: DrawItem[];
}

export interface PaperArea {
  /** the area to draw in, in points, y up (PDF) */
  left: number;
  bottom: number;
  width: number;
  height: number;
}

/** Legibility floors: a column at least 11 pt wide and a storey at least 16 pt tall (a choice: 5 pt type with room). */
export const MIN_COLUMN_PT = 11;
export const MIN_STOREY_PT = 16;
/** Type sizes on the diagram (points). */
const LABEL_SIZE = 4.6;
const LEVEL_SIZE = 5.5;
/** An upper bound of the advance of Work Sans (the PDF's font) per character, as a share of the type size: 0.62 em (wider than its widest lowercase and digits; uppercase runs are short here). */
export const CHAR_EM = 0.62;
export const textWidth = (text: string, size: number) => text.length * size * CHAR_EM;

/** The bounding box of a drawn item (text by the width bound above; the PDF fits text into it). */
export function itemBox(item: DrawItem): { x0: number; y0: number; x1: number; y1: number } {
  if (item.type === 'line')
    return { x0: Math.min(item.x1, item.x2), y0: Math.min(item.y1, item.y2), x1: Math.max(item.x1, item.x2), y1: Math.max(item.y1, item.y2) };
  if (item.type === 'box') return { x0: item.x, y0: item.y, x1: item.x + item.width, y1: item.y + item.height };
  const w = Math.min(textWidth(item.text, item.size), item.maxWidth);
  // descender 0.25 em below the baseline, ascender 0.8 em above (Work Sans is within both)
  return item.vertical
    ? { x0: item.x - item.size * 0.8, y0: item.y, x1: item.x + item.size * 0.25, y1: item.y + w }
    : { x0: item.x, y0: item.y - item.size * 0.25, x1: item.x + w, y1: item.y + item.size * 0.8 };
}

/**
 * Scales the diagram onto sheets: one sheet when a column and a storey stay legible, else tiles
 * of equal size, each with match lines at the edges it shares ("match line: continues on sheet 3").
 */
export function fitRiserDiagram(d: RiserDiagram, area: PaperArea, opts: { storeyHeight?: number } = {}): Sheet[] {
  const gutterLeft = 92; // the level names and elevations
  const top = 10;
  const plotW = area.width - gutterLeft - 10;
  const plotH = area.height - top - 14;
  const span = Math.max(d.maxElevation - d.minElevation, 1);
  const storey = opts.storeyHeight ?? storeyOf(d);
  const colPt = plotW / d.columns;
  const elevPt = plotH / span;
  const tilesX = colPt >= MIN_COLUMN_PT ? 1 : Math.ceil((d.columns * MIN_COLUMN_PT) / plotW);
  const tilesY = elevPt * storey >= MIN_STOREY_PT ? 1 : Math.ceil((span * MIN_STOREY_PT) / storey / plotH);
  const cw = Math.min(colPt * tilesX, 40); // never wider than 40 pt a column (a sparse diagram stays compact)
  const ep = (plotH * tilesY) / span;
  const sheets: Sheet[] = [];
  const colsPerTile = Math.ceil(d.columns / tilesX);
  const elevPerTile = span / tilesY;
  for (let ty = tilesY - 1; ty >= 0; ty--) {
    for (let tx = 0; tx < tilesX; tx++) {
      const number = sheets.length + 1;
      const c0 = tx * colsPerTile;
      const e0 = d.minElevation + ty * elevPerTile;
      const X = (col: number) => area.left + gutterLeft + (col - c0 + 0.5) * cw;
      const Y = (e: number) => area.bottom + 14 + (e - e0) * ep;
      const inTile = (p: Point) => p.x >= c0 - 0.5 && p.x < c0 + colsPerTile - 0.5 + 1e-9 && p.y >= e0 - 1e-9 && p.y <= e0 + elevPerTile + 1e-9;
      const clipX = (v: number) => Math.max(area.left + gutterLeft, Math.min(v, area.left + area.width - 10));
      const clipY = (v: number) => Math.max(area.bottom + 14, Math.min(v, area.bottom + area.height - top));
      const items: DrawItem[] = [];
      for (const l of d.levels) {
        if (l.elevation < e0 - 1e-9 || l.elevation > e0 + elevPerTile + 1e-9) continue;
        const y = Y(l.elevation);
        items.push({ type: 'line', x1: area.left + gutterLeft - 4, y1: y, x2: area.left + area.width - 10, y2: y, weight: 'level' });
        items.push({ type: 'text', x: area.left, y: y + 2, text: l.name, size: LEVEL_SIZE, maxWidth: gutterLeft - 6, bold: true });
        items.push({
          type: 'text',
          x: area.left,
          y: y - LEVEL_SIZE - 1,
          text: `el. ${withUnit(l.elevation, d.lengthUnit)}`,
          size: LEVEL_SIZE - 1,
          maxWidth: gutterLeft - 6,
        });
      }
      for (const p of d.pipes) {
        if (!inTile(p.from) && !inTile(p.to)) continue;
        // drawn as an L: along the level from the tee, then up or down to the node
        const ax = clipX(X(p.from.x));
        const ay = clipY(Y(p.from.y));
        const bx = clipX(X(p.to.x));
        const by = clipY(Y(p.to.y));
        if (ax !== bx) items.push({ type: 'line', x1: ax, y1: ay, x2: bx, y2: ay, weight: p.vertical ? 'riser' : 'pipe' });
        // the vertical part belongs to the node's column: drawn only on the sheet that holds that column
        const ownColumn = p.to.x >= c0 - 1e-9 && p.to.x < c0 + colsPerTile - 1e-9;
        if (!ownColumn) continue;
        if (ay !== by) items.push({ type: 'line', x1: bx, y1: ay, x2: bx, y2: by, weight: p.vertical ? 'riser' : 'pipe' });
        // the label runs along the pipe's own part: a riser or a drop beside its vertical run,
        // else the last column of its horizontal run (children sit in distinct columns)
        const drop = Math.abs(by - ay);
        if (drop >= 14) items.push({ type: 'text', x: bx - 1.5, y: Math.min(ay, by) + 2, text: p.label, size: LABEL_SIZE, maxWidth: drop - 4, vertical: true });
        else if (Math.abs(bx - ax) >= 10) {
          const w = Math.min(Math.abs(bx - ax), cw) - 3;
          items.push({ type: 'text', x: Math.max(ax, bx) - w - 1, y: ay + 1.5, text: p.label, size: LABEL_SIZE, maxWidth: w });
        }
      }
      const placed: { x0: number; y0: number; x1: number; y1: number }[] = [];
      const boxes: { x0: number; y0: number; x1: number; y1: number }[] = [];
      const overlaps = (b: { x0: number; y0: number; x1: number; y1: number }) => placed.some((q) => b.x0 < q.x1 && q.x0 < b.x1 && b.y0 < q.y1 && q.y0 < b.y1);
      for (const dv of d.devices) {
        if (!inTile(dv.at)) continue;
        // bold tags run wider than the regular bound: 1.3 × (Work Sans SemiBold, common capitals)
        const w = textWidth(dv.tag, 5) * 1.3 + 4;
        const cx = X(dv.at.x);
        const cy = Y(dv.at.y);
        const bx = Math.max(area.left + gutterLeft, Math.min(cx - w / 2, area.left + area.width - 10 - w));
        const by = Math.max(area.bottom + 14, Math.min(cy - 4.5, area.bottom + area.height - top - 9));
        items.push({ type: 'box', x: bx, y: by, width: w, height: 9 });
        boxes.push({ x0: bx, y0: by, x1: bx + w, y1: by + 9 });
        items.push({ type: 'text', x: bx + 2, y: by + 2.6, text: dv.tag, size: 5, maxWidth: w - 3, bold: true });
        // the name right of the box; where it would overlap another name it moves a line down or up, with a leader
        const labelX = bx + w + 3;
        const maxWidth = Math.max(Math.min(area.left + area.width - 10 - labelX, 150), 0);
        const width = Math.min(textWidth(dv.label, LABEL_SIZE), maxWidth);
        let y = by + 2.6;
        for (const k of [0, -7, 7, -14, 14, -21, 21, -28, 28]) {
          const candidate = Math.max(area.bottom + 16, Math.min(by + 2.6 + k, area.bottom + area.height - top - LABEL_SIZE));
          if (!overlaps({ x0: labelX, y0: candidate - 2, x1: labelX + width, y1: candidate + LABEL_SIZE })) {
            y = candidate;
            break;
          }
        }
        placed.push({ x0: labelX, y0: y - 2, x1: labelX + width, y1: y + LABEL_SIZE });
        if (Math.abs(y - (by + 2.6)) > 0.5) items.push({ type: 'line', x1: bx + w, y1: by + 4.5, x2: labelX - 0.5, y2: y + 1.5, weight: 'pipe' });
        items.push({ type: 'text', x: labelX, y, text: dv.label, size: LABEL_SIZE, maxWidth });
      }
      // zone boundaries: a dash-dot bar across the pipe just below the device's box, and the zone's
      // number in words left of it ("Zone 2 starts"), so the boundary reads without colour
      for (const zb of d.zones) {
        if (!inTile(zb.at)) continue;
        const cx = X(zb.at.x);
        const cy = Math.max(area.bottom + 14, Math.min(Y(zb.at.y), area.bottom + area.height - top)) - 7;
        const half = Math.min(cw / 2, 8);
        items.push({ type: 'line', x1: cx - half, y1: cy, x2: cx + half, y2: cy, weight: 'zone' });
        const text = `${zb.short} starts`;
        // bold runs wider than the regular bound: 1.15 × (Work Sans SemiBold against Regular, lower case)
        const w = textWidth(text, LABEL_SIZE) * 1.15;
        // left of the bar, else right of it, else a line lower or higher: the first place clear of every
        // device's box and name (a name placed right of its box can reach across this column)
        const left = Math.max(area.left + gutterLeft, cx - half - w - 2);
        const right = Math.min(cx + half + 2, area.left + area.width - 10 - w);
        const low = area.bottom + 2;
        const farLeft = area.left + gutterLeft;
        const candidates = [0, -7, -14, -21, 7, 14, 21, 28].flatMap((k) =>
          [left, right, farLeft].map((x) => ({ x, y: Math.max(low, cy - LABEL_SIZE - 0.5 + k) })),
        );
        // how much a place is in the way: each device box it covers counts 3 (a covered tag is unreadable), each name 1
        const hits = (c: { x: number; y: number }) => {
          const b = { x0: c.x, y0: c.y - 1, x1: c.x + w, y1: c.y + LABEL_SIZE };
          const meets = (q: { x0: number; y0: number; x1: number; y1: number }) => b.x0 < q.x1 && q.x0 < b.x1 && b.y0 < q.y1 && q.y0 < b.y1;
          return 3 * boxes.filter(meets).length + placed.filter(meets).length;
        };
        // the first clear place, else the least crowded one (a crowded base of several zone devices)
        const at = candidates.reduce((best, c) => (hits(c) < hits(best) ? c : best), candidates[0]);
        placed.push({ x0: at.x, y0: at.y - 1, x1: at.x + w, y1: at.y + LABEL_SIZE });
        items.push({ type: 'text', x: at.x, y: at.y, text, size: LABEL_SIZE, maxWidth: w + 2, bold: true });
      }
      for (const f of d.fixtures) {
        if (!inTile(f.at)) continue;
        items.push({ type: 'box', x: X(f.at.x) - 1.5, y: Y(f.at.y) - 1.5, width: 3, height: 3, fixtureId: f.fixtureId });
      }
      // match lines where this sheet meets its neighbours
      const right = area.left + area.width - 10;
      const base = area.bottom + 14;
      const roof = area.bottom + area.height - top;
      const neighbour = (dx: number, dy: number) => (tilesY - 1 - (ty + dy)) * tilesX + (tx + dx) + 1;
      if (tx < tilesX - 1) {
        items.push({ type: 'line', x1: right, y1: base, x2: right, y2: roof, weight: 'match' });
        items.push({
          type: 'text',
          x: right - 2,
          y: base + 2,
          text: `match line: continues on sheet ${neighbour(1, 0)}`,
          size: 5,
          maxWidth: roof - base - 4,
          vertical: true,
        });
      }
      if (tx > 0) {
        const left = area.left + gutterLeft;
        items.push({ type: 'line', x1: left, y1: base, x2: left, y2: roof, weight: 'match' });
        items.push({
          type: 'text',
          x: left + 7,
          y: base + 2,
          text: `match line: continues on sheet ${neighbour(-1, 0)}`,
          size: 5,
          maxWidth: roof - base - 4,
          vertical: true,
        });
      }
      if (ty < tilesY - 1) {
        items.push({ type: 'line', x1: area.left + gutterLeft, y1: roof, x2: right, y2: roof, weight: 'match' });
        items.push({
          type: 'text',
          x: area.left + gutterLeft + 2,
          y: roof - 6,
          text: `match line: continues on sheet ${neighbour(0, 1)}`,
          size: 5,
          maxWidth: right - area.left - gutterLeft - 4,
        });
      }
      if (ty > 0) {
        items.push({ type: 'line', x1: area.left + gutterLeft, y1: base, x2: right, y2: base, weight: 'match' });
        items.push({
          type: 'text',
          x: area.left + gutterLeft + 2,
          y: base + 2,
          text: `match line: continues on sheet ${neighbour(0, -1)}`,
          size: 5,
          maxWidth: right - area.left - gutterLeft - 4,
        });
      }
      sheets.push({ number, row: tilesY - 1 - ty, column: tx, items });
    }
  }
  return sheets;
}

/**
 * The smallest area, at least `base`, on which `fitRiserDiagram` draws the whole diagram on one
 * sheet (every column and storey at or above the legibility floors): the screen scrolls or scales
 * one drawing instead of tiling it. The 102 and 24 are the sheet's gutter and edges above.
 */
export function oneSheetArea(d: RiserDiagram, base: { width: number; height: number }): PaperArea {
  const span = Math.max(d.maxElevation - d.minElevation, 1);
  const width = Math.max(base.width, 92 + 10 + d.columns * MIN_COLUMN_PT + 1);
  const height = Math.max(base.height, 10 + 14 + (span * MIN_STOREY_PT) / storeyOf(d) + 1);
  return { left: 0, bottom: 0, width, height };
}

/** The typical storey: the median gap between consecutive levels (the whole span when there is one level). */
function storeyOf(d: RiserDiagram): number {
  const gaps = d.levels
    .slice(1)
    .map((l, i) => l.elevation - d.levels[i].elevation)
    .filter((g) => g > 0)
    .sort((p, q) => p - q);
  return gaps.length ? gaps[Math.floor(gaps.length / 2)] : Math.max(d.maxElevation - d.minElevation, 1);
}

/** The diagram's elements listed by floor, for the golden text and the page's key. */
export function riserElementsByFloor(d: RiserDiagram): string[] {
  const out: string[] = [];
  out.push(`levels: ${d.levels.map((l) => `${l.name} (el. ${withUnit(l.elevation, d.lengthUnit)})`).join('; ')}`);
  const floors = new Map<string, string[]>();
  for (const dv of d.devices) floors.set(dv.floor, [...(floors.get(dv.floor) ?? []), `${dv.tag} ${dv.label}`]);
  for (const [floor, list] of floors) out.push(`devices on ${floor}: ${list.join('; ')}`);
  const fx = new Map<string, number>();
  for (const f of d.fixtures) fx.set(f.floor, (fx.get(f.floor) ?? 0) + 1);
  for (const [floor, n] of fx) out.push(`checked fixtures on ${floor}: ${n}`);
  if (d.zones.length > 0) out.push(`zone boundaries: ${d.zones.map((z) => `${z.name} on ${z.floor}`).join('; ')}`);
  const risers = d.pipes.filter((p) => p.vertical);
  out.push(`risers: ${risers.map((p) => `${p.name} ${p.label}`).join('; ')}`);
  out.push(`pipes: ${d.pipes.length}, columns: ${d.columns}`);
  return out;
}
