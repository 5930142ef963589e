import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { DEFAULT_UPLOAD_MAX_BYTES } from '../../src/shared/api/fieldChanges';
import { MAX_FILE_NAME_LENGTH, rfc5987 } from '../../server/http/upload';
import { signedIn, startHarness, type Harness } from './support/harness';
import { fakeExe, fieldChangeWorld, htmlPage, startFieldChange, tinyJpeg, tinyPdf, tinyPng, upload } from './support/fieldChangeFixtures';

let h: Harness;
beforeAll(() => {
  h = startHarness();
});
afterAll(() => h.close());

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const stored = async (fieldChangeId: string) =>
  Number((await h.db('field_change_attachments').where({ field_change_id: fieldChangeId }).count({ n: '*' }).first())!.n);

async function draft() {
  const w = await fieldChangeWorld(h);
  const fc = await startFieldChange(w.contractor, w.fcBase, w.revisionId);
  return { ...w, ...fc };
}

describe('field change attachments', () => {
  it('when the contractor attaches a PDF, a PNG and a JPEG, then each is stored with its detected type and hash, and every project member downloads the same bytes as an attachment', async () => {
    const w = await draft();
    const inspector = await signedIn(h, w.inspectorUser);
    const files = [
      { content: tinyPdf(), name: 'Press elbow data sheet.pdf', declared: 'application/pdf', type: 'application/pdf' },
      { content: tinyPng(), name: 'riser-photo.PNG', declared: 'image/png', type: 'image/png' },
      // a real JPEG declared as something else: the content decides
      { content: tinyJpeg(), name: 'site photo.jpeg', declared: 'application/octet-stream', type: 'image/jpeg' },
    ];
    for (const f of files) {
      const res = await upload(w.contractor, w.url, f.content, f.name, f.declared);
      expect(res.status, f.name).toBe(201);
      const a = res.body.attachment;
      expect(a).toMatchObject({ contentType: f.type, byteLength: f.content.length, sha256: sha(f.content) });
      for (const reader of [w.designer, inspector, w.contractor]) {
        const got = await reader.get(a.url).responseType('blob').expect(200);
        expect(Buffer.compare(got.body as Buffer, f.content)).toBe(0);
        expect(got.headers['content-type']).toBe(f.type);
        expect(got.headers['x-content-type-options']).toBe('nosniff');
        expect(got.headers['content-disposition']).toBe(`attachment; filename="${a.fileName}"; filename*=UTF-8''${rfc5987(a.fileName)}`);
      }
    }
    const fc = (await w.designer.get(w.url).expect(200)).body.fieldChange;
    expect(fc.attachments.map((a: { fileName: string }) => a.fileName)).toEqual(['Press elbow data sheet.pdf', 'riser-photo.png', 'site photo.jpeg']);
    expect(fc.attachmentCount).toBe(3);
    const audit = await h.db('audit_log').where({ subject_id: w.fieldChange.id, action: 'field-change.attachment-added' });
    expect(audit).toHaveLength(3);
  });

  it('when an upload is over the size limit, then 413 says the limit and nothing is stored', async () => {
    const w = await draft();
    // one byte over the default limit, starting like a PDF so that only the size is wrong
    const big = Buffer.concat([tinyPdf(), Buffer.alloc(DEFAULT_UPLOAD_MAX_BYTES + 1 - tinyPdf().length, 0x20)]);
    const res = await upload(w.contractor, w.url, big, 'huge.pdf', 'application/pdf');
    expect(res.status).toBe(413);
    expect(res.body.error.message).toBe('The file is larger than the 10 MB limit; nothing was stored.');
    expect(await stored(w.fieldChange.id)).toBe(0);
    // exactly at the limit is accepted
    const atLimit = big.subarray(0, DEFAULT_UPLOAD_MAX_BYTES);
    expect((await upload(w.contractor, w.url, atLimit, 'at-limit.pdf', 'application/pdf')).status).toBe(201);
    expect(await stored(w.fieldChange.id)).toBe(1);
  });

  it('when a file is disguised (an .exe named .pdf, an HTML page declared image/png, an empty file), then 400 says so and nothing is stored', async () => {
    const w = await draft();
    const cases = [
      { content: fakeExe(), name: 'datasheet.pdf', declared: 'application/pdf' },
      { content: htmlPage(), name: 'photo.png', declared: 'image/png' },
      { content: Buffer.from('GIF89a\x01\x00\x01\x00', 'latin1'), name: 'photo.jpg', declared: 'image/jpeg' },
    ];
    for (const c of cases) {
      const res = await upload(w.contractor, w.url, c.content, c.name, c.declared);
      expect(res.status, c.name).toBe(400);
      expect(res.body.error.message).toBe(
        'The file is not a PDF, JPEG or PNG by its content (its name and declared type are not trusted); nothing was stored.',
      );
      expect(res.body.error.fields).toEqual({ file: 'Not a PDF, JPEG or PNG' });
    }
    const empty = await upload(w.contractor, w.url, Buffer.alloc(0), 'empty.pdf', 'application/pdf');
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toMatch(/empty/);
    const none = await w.contractor.send('POST', `${w.url}/attachments`, { file: 'not a file' });
    expect(none.status).toBe(400);
    expect(await stored(w.fieldChange.id)).toBe(0);
  });

  it('when a file name is hostile (a path, NUL and control characters, markup, a device name, 300 characters), then the file is stored under a sanitised name with the extension of its real type', async () => {
    const w = await draft();
    const cases: [string, Buffer, string][] = [
      ['../../etc/passwd', tinyPdf(), 'passwd.pdf'],
      ['..\\..\\Windows\\System32\\cmd.exe', tinyPng(), 'cmd.png'],
      ['<img src=x onerror=alert(1)>.jpg', tinyJpeg(), '_img src=x onerror=alert(1)_.jpg'],
      ['invoice.pdf\u202egnp.exe', tinyPng(), 'invoice.pdfgnp.png'],
      ['CON.pdf', tinyPdf(), 'attachment-CON.pdf'],
      ['...', tinyPdf(), 'attachment.pdf'],
    ];
    for (const [name, content, expected] of cases) {
      const res = await upload(w.contractor, w.url, content, name, 'application/octet-stream');
      expect(res.status, JSON.stringify(name)).toBe(201);
      expect(res.body.attachment.fileName, JSON.stringify(name)).toBe(expected);
      const got = await w.designer.get(res.body.attachment.url).expect(200);
      expect(got.headers['content-disposition']).toContain(`filename="${expected}"`);
    }
    // NUL and other control characters: sent encoded (RFC 5987) they reach the server and are removed;
    // sent raw in the part header the multipart body is malformed and refused whole
    const nul = await upload(w.contractor, w.url, tinyPdf(), 'data\u0000sheet\u0007\u001b[31m<script>alert(1)</script>.pdf', 'application/pdf', {
      encodedName: true,
    });
    expect(nul.status, JSON.stringify(nul.body)).toBe(201);
    expect(nul.body.attachment.fileName).toBe('script_.pdf');
    const nulOnly = await upload(w.contractor, w.url, tinyPdf(), 'data\u0000sheet\u0007<b>x.pdf', 'application/pdf', { encodedName: true });
    expect(nulOnly.body.attachment.fileName).toBe('datasheet_b_x.pdf');
    const before = await stored(w.fieldChange.id);
    const raw = await upload(w.contractor, w.url, tinyPdf(), 'data\u0000sheet.pdf', 'application/pdf');
    expect(raw.status).toBe(400);
    expect(raw.body.error.message).toBe('The upload could not be read; nothing was stored.');
    expect(await stored(w.fieldChange.id)).toBe(before);

    const long = await upload(w.contractor, w.url, tinyPdf(), `${'Ω'.repeat(300)}.pdf`, 'application/pdf');
    expect(long.status).toBe(201);
    expect([...long.body.attachment.fileName]).toHaveLength(MAX_FILE_NAME_LENGTH);
    expect(long.body.attachment.fileName).toMatch(/^Ω+\.pdf$/);
    // the ASCII fallback replaces what is not ASCII; the UTF-8 form keeps the name
    const got = await w.designer.get(long.body.attachment.url).expect(200);
    expect(got.headers['content-disposition']).toContain(`filename*=UTF-8''${rfc5987(long.body.attachment.fileName)}`);
    expect(got.headers['content-disposition']).toMatch(/filename="_+\.pdf"/);
    for (const row of await h.db('field_change_attachments').where({ field_change_id: w.fieldChange.id }).select('file_name')) {
      expect(row.file_name).not.toMatch(/[/\\<>\u0000-\u001f\u202e]/);
    }
  });

  it('when an upload comes without the CSRF header, then 403 and nothing is stored', async () => {
    const w = await draft();
    const res = await upload(w.contractor, w.url, tinyPdf(), 'sheet.pdf', 'application/pdf', { csrf: false });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CSRF_FAILED');
    expect(await stored(w.fieldChange.id)).toBe(0);
  });

  it('when a contractor of another project asks for the field change, its side by side or its attachments, then 404 tells them nothing, and they cannot upload', async () => {
    const w = await draft();
    const a = (await upload(w.contractor, w.url, tinyPdf(), 'sheet.pdf', 'application/pdf').expect(201)).body.attachment;
    const elsewhere = await fieldChangeWorld(h);
    const outsider = elsewhere.contractor;
    for (const url of [w.fcBase, w.url, `${w.url}/comparison`, a.url, `/api/projects/${w.projectId}/field-changes`]) {
      const res = await outsider.get(url);
      expect(res.status, url).toBe(404);
      expect(JSON.stringify(res.body)).not.toContain(w.fieldChange.title);
    }
    expect((await upload(outsider, w.url, tinyPdf(), 'mine.pdf', 'application/pdf')).status).toBe(404);
    expect((await outsider.send('DELETE', a.url)).status).toBe(404);
    // the ids of one project do not reach another project's field change either
    const crossUrl = `${elsewhere.fcBase}/${w.fieldChange.id}/attachments/${a.id}`;
    expect((await outsider.get(crossUrl)).status).toBe(404);
    expect(await stored(w.fieldChange.id)).toBe(1);
  });

  it('when the field change is decided, then no file is added or removed; a draft’s author removes one', async () => {
    const w = await draft();
    const a = (await upload(w.contractor, w.url, tinyPdf(), 'sheet.pdf', 'application/pdf').expect(201)).body.attachment;
    const b = (await upload(w.contractor, w.url, tinyPng(), 'photo.png', 'image/png').expect(201)).body.attachment;
    expect((await w.designer.send('DELETE', b.url)).status).toBe(403);
    await w.contractor.send('DELETE', b.url).expect(204);
    expect(await stored(w.fieldChange.id)).toBe(1);
    const fc = (await w.contractor.get(w.url).expect(200)).body.fieldChange;
    const doc = structuredClone(fc.document);
    doc.segments[0].fittings = [{ typeId: 'elbow-90-standard', count: 4 }];
    const saved = (await w.contractor.send('PATCH', w.url, { document: doc, version: fc.version }).expect(200)).body.fieldChange;
    const proposed = (await w.contractor.send('POST', `${w.url}/propose`, { version: saved.version }).expect(200)).body.fieldChange;
    expect((await w.contractor.send('DELETE', a.url)).status).toBe(409);
    // while proposed, more product data may still be sent
    expect((await upload(w.contractor, w.url, tinyJpeg(), 'more.jpg', 'image/jpeg')).status).toBe(201);
    await w.designer.send('POST', `${w.url}/decline`, { version: proposed.version, reason: 'Use the listed fitting.' }).expect(200);
    const late = await upload(w.contractor, w.url, tinyPdf(), 'late.pdf', 'application/pdf');
    expect(late.status).toBe(409);
    expect(await stored(w.fieldChange.id)).toBe(2);
  });
});
