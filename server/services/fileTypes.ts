/**
 * What a stored file is, by its content, and a name safe to store and send: the rules the
 * attachments service applies to every file, whatever brought it (an upload today).
 */
import type { ATTACHMENT_TYPES } from '../../src/shared/api/fieldChanges';

export type DetectedType = (typeof ATTACHMENT_TYPES)[number];

/**
 * File signatures ("magic numbers"):
 *   PDF  "%PDF-" at offset 0 — ISO 32000-1:2008 §7.5.2 (file header);
 *   JPEG FF D8 FF — the SOI marker FF D8 (ITU-T T.81 | ISO/IEC 10918-1, Annex B) followed by the next marker's FF;
 *   PNG  89 50 4E 47 0D 0A 1A 0A — the PNG signature, ISO/IEC 15948:2004 §5.2 (W3C PNG 2nd ed. §5.2).
 */
const SIGNATURES: { type: DetectedType; bytes: number[]; extensions: string[] }[] = [
  { type: 'application/pdf', bytes: [0x25, 0x50, 0x44, 0x46, 0x2d], extensions: ['pdf'] },
  { type: 'image/jpeg', bytes: [0xff, 0xd8, 0xff], extensions: ['jpg', 'jpeg'] },
  { type: 'image/png', bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a], extensions: ['png'] },
];

/** The type the content says it is, or null when it is none of the accepted ones. */
export function detectType(content: Buffer): DetectedType | null {
  for (const s of SIGNATURES) if (content.length >= s.bytes.length && s.bytes.every((b, i) => content[i] === b)) return s.type;
  return null;
}

/** The longest stored file name in characters, extension included (a choice; well under every file system's 255). */
export const MAX_FILE_NAME_LENGTH = 120;
// Windows device names, refused as a base name on that system (Microsoft, "Naming Files, Paths, and Namespaces")
const RESERVED_BASE = /^(con|prn|aux|nul|com[0-9]|lpt[0-9])$/i;

/**
 * A file name safe to store, show and send in Content-Disposition: the last path segment only,
 * without control, bidirectional-override or reserved characters (< > : " / \ | ? * and ;), no
 * leading dots, not a device name, at most MAX_FILE_NAME_LENGTH characters, and an extension that
 * matches the detected type (the original one when it already does).
 */
export function sanitizeFileName(original: string, type: DetectedType): string {
  const signature = SIGNATURES.find((s) => s.type === type)!;
  let name = original.normalize('NFC');
  name = name.split(/[/\\]/).pop() ?? '';
  name = name
    // C0 and C1 control characters, DEL, and the bidirectional overrides and isolates that can disguise an extension
    .replace(/[\u0000-\u001f\u007f-\u009f\u200e\u200f\u202a-\u202e\u2066-\u2069]/g, '')
    .replace(/[<>:"|?*;]/g, '_')
    .replace(/\s+/g, ' ')
    .trim()
    .replace(/^[.\s]+/, '')
    .replace(/[.\s]+$/, '');
  const dot = name.lastIndexOf('.');
  const ext = dot > 0 ? name.slice(dot + 1).toLowerCase() : '';
  let base = dot > 0 ? name.slice(0, dot) : name;
  const keptExt = signature.extensions.includes(ext) ? ext : signature.extensions[0];
  base = base.replace(/[.\s]+$/, '');
  if (!base || RESERVED_BASE.test(base.split('.')[0])) base = `attachment${base ? `-${base}` : ''}`;
  const room = MAX_FILE_NAME_LENGTH - keptExt.length - 1;
  base =
    [...base]
      .slice(0, room)
      .join('')
      .replace(/[.\s]+$/, '') || 'attachment';
  return `${base}.${keptExt}`;
}
