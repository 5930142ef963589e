import { describe, expect, it } from 'vitest';
import { MutationObserver } from '@tanstack/react-query';
import { ApiError } from '../../src/lib/api-client';
import { createQueryClient } from '../../src/lib/query-client';

const signedOut = new ApiError(401, 'NOT_SIGNED_IN', 'Sign in first');

describe('session expiry', () => {
  it('when any query answers 401, then the app is told the person is signed out', async () => {
    let told = 0;
    const client = createQueryClient(() => told++);
    await client.fetchQuery({ queryKey: ['projects', 'list'], queryFn: () => Promise.reject(signedOut) }).catch(() => undefined);
    expect(told).toBe(1);
  });

  it('when a mutation answers 401, then the app is told too', async () => {
    let told = 0;
    const client = createQueryClient(() => told++);
    await new MutationObserver(client, { mutationFn: () => Promise.reject(signedOut) }).mutate().catch(() => undefined);
    expect(told).toBe(1);
  });

  it('when a query fails in another way (404), then the session is left alone', async () => {
    let told = 0;
    const client = createQueryClient(() => told++);
    await client
      .fetchQuery({ queryKey: ['projects', 'detail', 'x'], queryFn: () => Promise.reject(new ApiError(404, 'NOT_FOUND', 'No such project')) })
      .catch(() => undefined);
    expect(told).toBe(0);
  });
});
