import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { ApiError, createApiClient, toApiError } from '../../src/lib/api-client';
import { csrfFailed, fakeFetch } from './fake-fetch';

const Thing = z.object({ thing: z.object({ id: z.string() }) });

describe('api client', () => {
  it('when reading, then it sends the session cookie, asks for no CSRF token and checks the answer against the schema', async () => {
    const fetch = fakeFetch(() => ({ status: 200, body: { thing: { id: 'a1' }, extra: true } }));
    const api = createApiClient(fetch.impl);
    await expect(api.get('/api/things/a1', Thing)).resolves.toEqual({ thing: { id: 'a1' } });
    expect(fetch.calls).toHaveLength(1);
    expect(fetch.calls[0].credentials).toBe('same-origin');
    expect(fetch.calls[0].headers['x-csrf-token']).toBeUndefined();
  });

  it('when writing, then it fetches the CSRF token once and sends it with every write', async () => {
    const fetch = fakeFetch((call) =>
      call.url === '/api/csrf-token' ? { status: 200, body: { token: 'tok-1' } } : { status: 200, body: { thing: { id: 'x' } } },
    );
    const api = createApiClient(fetch.impl);
    await api.post('/api/things', { name: 'a' }, Thing);
    await api.patch('/api/things/x', { name: 'b' }, Thing);
    expect(fetch.calls.map((c) => `${c.method} ${c.url}`)).toEqual(['GET /api/csrf-token', 'POST /api/things', 'PATCH /api/things/x']);
    expect(fetch.calls[1].headers['x-csrf-token']).toBe('tok-1');
    expect(fetch.calls[2].headers['x-csrf-token']).toBe('tok-1');
    expect(fetch.calls[1].headers['content-type']).toBe('application/json');
    expect(fetch.calls[1].body).toEqual({ name: 'a' });
  });

  it('when the body is FormData (an upload), then it goes as multipart with the CSRF token and no JSON content type', async () => {
    const fetch = fakeFetch((call) =>
      call.url === '/api/csrf-token' ? { status: 200, body: { token: 'tok-9' } } : { status: 201, body: { thing: { id: 'f' } } },
    );
    const api = createApiClient(fetch.impl);
    const form = new FormData();
    form.append('file', new Blob(['%PDF-1.4'], { type: 'application/pdf' }), 'sheet.pdf');
    await api.request('/api/uploads', { method: 'POST', body: form, schema: Thing });
    const sent = fetch.calls[1];
    expect(sent.headers['x-csrf-token']).toBe('tok-9');
    // fetch must set multipart/form-data with its boundary itself
    expect(sent.headers['content-type']).toBeUndefined();
    expect((sent.formData?.get('file') as File).name).toBe('sheet.pdf');
  });

  it('when the token is refused once (CSRF_FAILED), then it fetches a new token and retries once', async () => {
    let tokens = 0;
    const fetch = fakeFetch((call) => {
      if (call.url === '/api/csrf-token') return { status: 200, body: { token: `tok-${++tokens}` } };
      return call.headers['x-csrf-token'] === 'tok-1' ? csrfFailed : { status: 200, body: { thing: { id: 'ok' } } };
    });
    const api = createApiClient(fetch.impl);
    await expect(api.post('/api/things', {}, Thing)).resolves.toEqual({ thing: { id: 'ok' } });
    expect(fetch.calls.map((c) => c.headers['x-csrf-token'] ?? '-')).toEqual(['-', 'tok-1', '-', 'tok-2']);
  });

  it('when the token is refused twice, then it stops and reports CSRF_FAILED (no endless retry)', async () => {
    const fetch = fakeFetch((call) => (call.url === '/api/csrf-token' ? { status: 200, body: { token: 't' } } : csrfFailed));
    const api = createApiClient(fetch.impl);
    const error = await api.delete('/api/things/1').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).code).toBe('CSRF_FAILED');
    expect(fetch.calls.filter((c) => c.method === 'DELETE')).toHaveLength(2);
  });

  it('when the session changes (resetCsrfToken), then the next write fetches a new token', async () => {
    let tokens = 0;
    const fetch = fakeFetch((call) => (call.url === '/api/csrf-token' ? { status: 200, body: { token: `tok-${++tokens}` } } : { status: 204 }));
    const api = createApiClient(fetch.impl);
    await api.post('/api/auth/sign-out');
    api.resetCsrfToken();
    await api.post('/api/auth/sign-out');
    expect(fetch.calls.filter((c) => c.url === '/api/csrf-token')).toHaveLength(2);
    expect(fetch.calls[3].headers['x-csrf-token']).toBe('tok-2');
  });

  it('when a write answers 204, then it resolves with nothing', async () => {
    const fetch = fakeFetch((call) => (call.url === '/api/csrf-token' ? { status: 200, body: { token: 't' } } : { status: 204 }));
    await expect(createApiClient(fetch.impl).delete('/api/x')).resolves.toBeUndefined();
  });

  it('when the answer is 400 with fields, then the ApiError carries code, message and each field', async () => {
    const body = {
      error: {
        code: 'VALIDATION_FAILED',
        message: 'Check the fields',
        fields: { name: 'Enter a project name', 'members.0.email': 'Enter a valid e-mail address' },
      },
    };
    const fetch = fakeFetch((call) => (call.url === '/api/csrf-token' ? { status: 200, body: { token: 't' } } : { status: 400, body }));
    const error = (await createApiClient(fetch.impl)
      .post('/api/projects', {})
      .catch((e: unknown) => e)) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect([error.status, error.code, error.message]).toEqual([400, 'VALIDATION_FAILED', 'Check the fields']);
    expect(error.fields).toEqual(body.error.fields);
  });

  it('when the answer is 409 STALE_VERSION, then the code survives for the form to show Reload', async () => {
    const fetch = fakeFetch((call) =>
      call.url === '/api/csrf-token'
        ? { status: 200, body: { token: 't' } }
        : { status: 409, body: { error: { code: 'STALE_VERSION', message: 'Changed meanwhile' } } },
    );
    const error = (await createApiClient(fetch.impl)
      .patch('/api/projects/p', { version: 1 })
      .catch((e: unknown) => e)) as ApiError;
    expect([error.status, error.code]).toEqual([409, 'STALE_VERSION']);
  });

  it('when the server answers outside the error format (a proxy page), then the error keeps the status and says UNKNOWN', async () => {
    const fetch = fakeFetch(() => ({ status: 502, raw: '<html>Bad gateway</html>' }));
    const error = (await createApiClient(fetch.impl)
      .get('/api/projects', Thing)
      .catch((e: unknown) => e)) as ApiError;
    expect([error.status, error.code]).toEqual([502, 'UNKNOWN']);
  });

  it('when the network fails, then the error is NETWORK with status 0', async () => {
    const fetch = fakeFetch(() => new TypeError('Failed to fetch'));
    const error = (await createApiClient(fetch.impl)
      .get('/api/projects', Thing)
      .catch((e: unknown) => e)) as ApiError;
    expect([error.status, error.code]).toEqual([0, 'NETWORK']);
  });

  it('when a 200 answer does not match the shared schema, then it is refused as BAD_RESPONSE', async () => {
    const fetch = fakeFetch(() => ({ status: 200, body: { thing: { id: 42 } } }));
    const error = (await createApiClient(fetch.impl)
      .get('/api/things/1', Thing)
      .catch((e: unknown) => e)) as ApiError;
    expect(error.code).toBe('BAD_RESPONSE');
  });

  it('when toApiError gets the one error format, then it maps it field for field', () => {
    const error = toApiError(404, { error: { code: 'NOT_FOUND', message: 'No such project' } });
    expect([error.status, error.code, error.message, error.fields]).toEqual([404, 'NOT_FOUND', 'No such project', {}]);
  });
});
