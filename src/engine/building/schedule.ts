/**
 * Fixture schedules by name: a CSV (or a range pasted from a spreadsheet, tab-separated) in the
 * trade's words — floor, unit or room, fixture as the model codes name it, count, private or
 * public — read into fixture groups, each row matched to a catalog fixture type or given an error
 * that names the row. Nothing is applied here: the preview is the caller's (pure).
 *
 * Columns (header row required, any order, case-insensitive): floor, unit (or room), fixture,
 * count, occupancy (optional; private when empty). CSV parsing is Papa Parse's.
 */
import Papa from 'papaparse';
import { FIXTURE_TYPES, type FixtureType } from '../catalog/fixtures';

/** Largest schedule accepted: 1 MiB of text, a few tens of thousands of rows. */
export const SCHEDULE_MAX_BYTES = 1024 * 1024;

export interface ScheduleRow {
  /** 1-based line in the text (the header is line 1). */
  line: number;
  floor: string;
  unit: string;
  fixture: string;
  count: number | null;
  occupancy: 'private' | 'public';
  fixtureTypeId: string | null;
  /** The catalog label matched, for the preview. */
  matchedLabel: string | null;
  error: string | null;
}

export interface ScheduleResult {
  rows: ScheduleRow[];
  /** Problems with the file as a whole (no header, wrong columns, too large). */
  fileErrors: string[];
}

const norm = (s: string) =>
  s
    .toLowerCase()
    .replace(/[–—]/g, '-')
    .replace(/[^a-z0-9/ ]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();

/**
 * Words a schedule uses for a fixture → the catalog's base id (without the occupancy suffix).
 * Written for this product: the phrases are the ordinary names the model codes' fixture tables
 * and plumbing schedules use (common practice), several for each type.
 */
const ALIASES: readonly [phrases: string[], privateId: string | null, publicId: string | null][] = [
  [
    ['water closet flush tank', 'water closet tank', 'water closet gravity tank', 'wc tank', 'toilet tank', 'toilet', 'water closet', 'wc'],
    'water-closet-flush-tank-private',
    'water-closet-flush-tank-public',
  ],
  [
    ['water closet flushometer valve', 'water closet flush valve', 'wc flush valve', 'water closet flushometer'],
    'water-closet-flush-valve-private',
    'water-closet-flush-valve-public',
  ],
  [
    ['water closet flushometer tank', 'water closet pressure assisted', 'wc flushometer tank'],
    'water-closet-flushometer-tank',
    'water-closet-flushometer-tank',
  ],
  [['lavatory', 'lav', 'wash basin', 'basin', 'vanity'], 'lavatory-private', 'lavatory-public'],
  [['shower', 'shower head', 'shower valve'], 'shower-private', 'shower-public'],
  [['bathtub', 'tub', 'bath'], 'bathtub-private', 'bathtub-public'],
  [['kitchen sink', 'sink kitchen', 'sink residential', 'sink'], 'kitchen-sink-private', null],
  [['dishwasher', 'dishwashing machine', 'dishwasher residential'], 'dishwasher-private', null],
  [['clothes washer', 'washing machine', 'washer', 'laundry washer'], 'clothes-washer-private', null],
  [['laundry tray', 'laundry sink', 'laundry tub'], 'laundry-tray-private', null],
  [['bidet'], 'bidet-private', null],
  [['combination fixture', 'combination sink and tray'], 'combination-fixture-private', null],
  [['service sink', 'mop sink', 'mop basin', 'janitor sink'], null, 'service-sink'],
  [['drinking fountain', 'water cooler', 'bottle filler'], null, 'drinking-fountain'],
  [['urinal', 'urinal flush valve', 'urinal flushometer valve'], null, 'urinal-flush-valve-public'],
  [['urinal 1 in flush valve', 'urinal 1 inch flush valve'], null, 'urinal-flush-valve-1in-public'],
  [['hose bibb', 'sillcock', 'hose bib', 'wall hydrant'], 'hose-bibb', 'hose-bibb'],
  [['bathroom group flush tank', 'bathroom group'], 'bathroom-group-flush-tank-private', null],
  [['bathroom group flushometer valve', 'bathroom group flush valve'], 'bathroom-group-flush-valve-private', null],
];

const PHRASES = new Map<string, [string | null, string | null]>();
for (const [phrases, priv, pub] of ALIASES) for (const p of phrases) PHRASES.set(norm(p), [priv, pub]);

/** The catalog fixture type a schedule's words name, or null. Exact catalog ids are accepted too. */
export function matchFixtureType(words: string, occupancy: 'private' | 'public'): FixtureType | null {
  const raw = words.trim();
  if (FIXTURE_TYPES[raw]) return FIXTURE_TYPES[raw];
  const key = norm(raw);
  const hit = PHRASES.get(key);
  if (hit) {
    const id = occupancy === 'public' ? (hit[1] ?? hit[0]) : (hit[0] ?? hit[1]);
    return id && FIXTURE_TYPES[id] ? FIXTURE_TYPES[id] : null;
  }
  // A catalog label written out ("Water closet, gravity tank (close coupled)").
  for (const t of Object.values(FIXTURE_TYPES)) {
    if (norm(t.label) === key && (t.occupancy === occupancy || !Object.values(FIXTURE_TYPES).some((o) => norm(o.label) === key && o.occupancy === occupancy)))
      return t;
  }
  return null;
}

const HEADERS: Record<string, keyof Pick<ScheduleRow, 'floor' | 'unit' | 'fixture' | 'count' | 'occupancy'>> = {
  floor: 'floor',
  level: 'floor',
  unit: 'unit',
  room: 'unit',
  'unit or room': 'unit',
  apartment: 'unit',
  fixture: 'fixture',
  'fixture type': 'fixture',
  count: 'count',
  quantity: 'count',
  qty: 'count',
  occupancy: 'occupancy',
  use: 'occupancy',
};

export function parseFixtureSchedule(text: string): ScheduleResult {
  const fileErrors: string[] = [];
  if (new TextEncoder().encode(text).length > SCHEDULE_MAX_BYTES) {
    return { rows: [], fileErrors: ['The schedule is larger than 1 MiB; split it by floor.'] };
  }
  if (text.includes('\u0000')) return { rows: [], fileErrors: ['This is not a text (CSV) file.'] };
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy', delimiter: '' });
  if (parsed.data.length === 0) return { rows: [], fileErrors: ['The schedule is empty.'] };
  const header = parsed.data[0].map((h) => HEADERS[norm(h)]);
  for (const need of ['floor', 'unit', 'fixture', 'count'] as const) {
    if (!header.includes(need))
      fileErrors.push(`The first line must name the columns; "${need}" is missing (expected: floor, unit, fixture, count, occupancy).`);
  }
  if (fileErrors.length > 0) return { rows: [], fileErrors };
  for (const e of parsed.errors) {
    if (e.type !== 'Delimiter') fileErrors.push(`Line ${(e.row ?? 0) + 1}: ${e.message}`);
  }
  const rows: ScheduleRow[] = [];
  parsed.data.slice(1).forEach((cells, i) => {
    const line = i + 2;
    const cell = (k: string) => {
      const at = header.indexOf(k as never);
      return at === -1 ? '' : (cells[at] ?? '').trim();
    };
    const occText = norm(cell('occupancy'));
    let error: string | null = null;
    const occupancy: 'private' | 'public' = occText === 'public' ? 'public' : 'private';
    if (occText !== '' && occText !== 'private' && occText !== 'public')
      error = `Line ${line}: occupancy "${cell('occupancy')}" is neither private nor public.`;
    const countText = cell('count');
    const count = /^\d+$/.test(countText) ? Number(countText) : null;
    if (!error && (count === null || count < 1 || count > 1000)) error = `Line ${line}: count "${countText}" is not a whole number from 1 to 1,000.`;
    const fixture = cell('fixture');
    const type = fixture === '' ? null : matchFixtureType(fixture, occupancy);
    if (!error && fixture === '') error = `Line ${line}: no fixture named.`;
    else if (!error && !type)
      error = `Line ${line}: "${fixture}" is not a fixture type Headroom knows; use a name such as "water closet, flush tank", "lavatory", "shower", "kitchen sink".`;
    if (!error && cell('floor') === '') error = `Line ${line}: no floor named.`;
    if (!error && cell('unit') === '') error = `Line ${line}: no unit or room named.`;
    rows.push({
      line,
      floor: cell('floor'),
      unit: cell('unit'),
      fixture,
      count,
      occupancy,
      fixtureTypeId: type?.id ?? null,
      matchedLabel: type ? `${type.label} (${type.occupancy})` : null,
      error,
    });
  });
  return { rows, fileErrors };
}

/** The schedule's own format back out: floor, unit, fixture (the catalog label), count, occupancy. */
export function formatFixtureSchedule(rows: readonly { floor: string; unit: string; fixtureTypeId: string; count: number }[]): string {
  return Papa.unparse({
    fields: ['floor', 'unit', 'fixture', 'count', 'occupancy'],
    data: rows.map((r) => {
      const t = FIXTURE_TYPES[r.fixtureTypeId];
      return [r.floor, r.unit, t ? t.label : r.fixtureTypeId, r.count, t?.occupancy === 'public' ? 'public' : 'private'];
    }),
  });
}
