/**
 * The bounds of server/http/bounds.ts checked on the JSON text itself, before JSON.parse sees it.
 *
 * Why: a 1 MB body of 330,000 empty objects (`"nodes":[{},{},…]`, issue 13 finding 1) costs
 * JSON.parse 150–270 ms of the one event loop (330,000 objects made and then collected), during
 * which no other user is answered; three such senders in a loop kept every other request waiting
 * 7–10 s (`npm run test:load`). Counting the items of every array and the keys of every object in
 * one pass over the bytes costs about a millisecond per megabyte and stops at the first list over
 * its bound, so such a body is refused before anything is built from it.
 *
 * The scan follows JSON's grammar only as far as counting needs: strings (with their escapes) are
 * skipped, `[`/`{` open a level, `,` at a level adds an item, `]`/`}` close it. Text that is not
 * JSON may be counted wrongly, but JSON.parse refuses it right after; a body within the bounds is
 * never refused here (a property test checks the scan against the walk over the parsed value).
 */
import { BODY_BOUNDS } from './bounds';

const QUOTE = 0x22;
const BACKSLASH = 0x5c;
const OPEN_OBJECT = 0x7b;
const CLOSE_OBJECT = 0x7d;
const OPEN_ARRAY = 0x5b;
const CLOSE_ARRAY = 0x5d;
const COMMA = 0x2c;
const COLON = 0x3a;
const isSpace = (b: number) => b === 0x20 || b === 0x0a || b === 0x0d || b === 0x09;

interface Level {
  array: boolean;
  /** commas seen at this level: items (or keys) so far = commas + 1 once there is one */
  commas: number;
  /** where an object's last key is in the text (decoded only to name the place of a refusal) */
  keyStart: number;
  keyEnd: number;
  /** in an object, the next string is a key */
  expectKey: boolean;
}

type Bounds = { maxArrayItems: number; maxObjectKeys: number };

/** The first list or object in the JSON text over a bound, as [field path, what is wrong], or null. */
export function firstOverBoundInJson(text: Buffer, bounds: Bounds = BODY_BOUNDS): [string, string] | null {
  const levels: Level[] = [];
  const n = text.length;
  for (let i = 0; i < n; i++) {
    const b = text[i];
    if (b === QUOTE) {
      // a string: to its closing quote, skipping escaped characters
      const start = i + 1;
      i = closingQuote(text, start);
      const top = levels[levels.length - 1];
      if (top && !top.array && top.expectKey) {
        top.keyStart = start;
        top.keyEnd = Math.min(i, n);
        top.expectKey = false;
      }
      continue;
    }
    if (b === OPEN_OBJECT || b === OPEN_ARRAY) {
      levels.push({ array: b === OPEN_ARRAY, commas: 0, keyStart: 0, keyEnd: 0, expectKey: b === OPEN_OBJECT });
      continue;
    }
    if (b === CLOSE_OBJECT || b === CLOSE_ARRAY) {
      levels.pop();
      continue;
    }
    if (b === COMMA) {
      const top = levels[levels.length - 1];
      if (!top) continue;
      top.commas++;
      // commas + 1 items are there once the next one starts; refuse as soon as it is one too many
      if (top.array && top.commas + 1 > bounds.maxArrayItems)
        return [pathOf(text, levels, levels.length - 1), `Has more than ${bounds.maxArrayItems} items; at most ${bounds.maxArrayItems} are accepted`];
      if (!top.array) {
        if (top.commas + 1 > bounds.maxObjectKeys) return [pathOf(text, levels, levels.length - 1), `Has more than ${bounds.maxObjectKeys} fields`];
        top.expectKey = true;
      }
      continue;
    }
    if (b === COLON || isSpace(b)) continue;
  }
  return null;
}

/** Where the string that starts at `from` ends: the next quote not escaped (an odd run of backslashes before it), found natively; n when there is none. */
function closingQuote(text: Buffer, from: number): number {
  let j = text.indexOf(QUOTE, from);
  while (j !== -1) {
    let slashes = 0;
    while (j - 1 - slashes >= from && text[j - 1 - slashes] === BACKSLASH) slashes++;
    if (slashes % 2 === 0) return j;
    j = text.indexOf(QUOTE, j + 1);
  }
  return text.length;
}

/** A key as the parsed body has it (its escapes read), or its raw text when it is not a valid JSON string. */
function keyText(text: Buffer, level: Level): string {
  const raw = text.toString('utf8', level.keyStart, level.keyEnd);
  try {
    return JSON.parse(`"${raw}"`) as string;
  } catch {
    return raw;
  }
}

/** The field path of level `k`: the keys and indices of the levels above it ('(body)' for the top). */
function pathOf(text: Buffer, levels: readonly Level[], k: number): string {
  const parts: string[] = [];
  for (let j = 0; j < k; j++) parts.push(levels[j].array ? String(levels[j].commas) : keyText(text, levels[j]));
  return parts.length ? parts.join('.') : '(body)';
}
