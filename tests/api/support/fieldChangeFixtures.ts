import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import { rfc5987 } from '../../../server/http/upload';
import { projectWithRoles, signedIn, type Client, type Harness } from './harness';
import { smallDocument } from './documents';
import { issuedSystem } from './smtpSink';

/** A project with its three roles, an issued system (the small two-storey test document) and the contractor signed in. */
export async function fieldChangeWorld(h: Harness, document: Record<string, unknown> = smallDocument()) {
  const p = await projectWithRoles(h);
  const issued = await issuedSystem(p.designer, p.projectId, document);
  const contractor = await signedIn(h, p.contractorUser);
  const fcBase = `/api/projects/${p.projectId}/systems/${issued.systemId}/field-changes`;
  return { ...p, ...issued, contractor, fcBase, issuedDocument: issued.revision.document as ReturnType<typeof smallDocument> };
}

/** The contractor starts a field change on the issued revision; returns it and its API path. */
export async function startFieldChange(contractor: Client, fcBase: string, revisionId: string, title = 'Press-connect fittings on the service line') {
  const res = await contractor.send('POST', fcBase, { revisionId, title });
  if (res.status !== 201) throw new Error(`field change not created: ${res.status} ${JSON.stringify(res.body)}`);
  return { fieldChange: res.body.fieldChange, url: `${fcBase}/${res.body.fieldChange.id}` };
}

/** A deep copy of a document, changed by `edit`. */
export function edited<T>(document: T, edit: (d: T) => void): T {
  const copy = structuredClone(document);
  edit(copy);
  return copy;
}

/**
 * Uploads one file in the field "file" with the client's CSRF token (or none). The multipart body
 * is written here byte for byte, so the file name reaches the server exactly as given (form-data,
 * which supertest's .attach uses, strips paths on the client side).
 */
export function upload(
  client: Client,
  url: string,
  content: Buffer,
  filename: string,
  contentType: string,
  opts: { csrf?: boolean; encodedName?: boolean } = {},
) {
  const boundary = `----headroom-test-${randomUUID()}`;
  // encodedName: the RFC 5987 form filename*=UTF-8''…, which can carry any character, NUL included
  const name = opts.encodedName ? `filename*=UTF-8''${rfc5987(filename)}` : `filename="${filename}"`;
  const body = Buffer.concat([
    Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; ${name}\r\nContent-Type: ${contentType}\r\n\r\n`, 'utf8'),
    content,
    Buffer.from(`\r\n--${boundary}--\r\n`, 'utf8'),
  ]);
  const req = client.agent.post(`${url}/attachments`).set('Content-Type', `multipart/form-data; boundary=${boundary}`);
  if (opts.csrf !== false) req.set('x-csrf-token', client.token);
  return req.send(body);
}

// ---- small files whose first bytes are what each format's signature says (server/http/upload.ts)

/** A one-page PDF, made by hand: header "%PDF-1.4" (ISO 32000-1 §7.5.2), a page, a trailer. */
export const tinyPdf = () =>
  Buffer.from(
    '%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[3 0 R]/Count 1>>endobj\n3 0 obj<</Type/Page/Parent 2 0 R/MediaBox[0 0 200 200]>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n',
    'latin1',
  );
/** A 1×1 PNG (signature 89 50 4E 47 0D 0A 1A 0A, IHDR, IDAT, IEND). */
export const tinyPng = () => Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');
/** The start of a JFIF JPEG: SOI FF D8, APP0 "JFIF", then EOI FF D9 (enough for the signature check). */
export const tinyJpeg = () =>
  Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00, 0xff, 0xd9]);
/** A Windows executable's start: the "MZ" DOS header. */
export const fakeExe = () => Buffer.concat([Buffer.from('MZ\x90\x00\x03\x00\x00\x00', 'latin1'), Buffer.alloc(56)]);
export const htmlPage = () => Buffer.from('<!doctype html><html><body><script>alert(document.cookie)</script></body></html>');

/** poppler-utils' pdftotext, white space made single (it wraps lines as it likes). */
export function pdfPlainText(bytes: Buffer): string {
  const file = path.join(os.tmpdir(), `headroom-fc-${randomUUID()}.pdf`);
  fs.writeFileSync(file, bytes);
  try {
    return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
  } finally {
    fs.rmSync(file, { force: true });
  }
}
