import { describe, expect, it } from 'vitest';
import { ApiError } from '../../src/lib/api-client';
import { errorMessage, isNotFound, isSignedOut, isStaleVersion } from '../../src/lib/error-messages';
import { applyServerFieldErrors } from '../../src/lib/form-errors';
import { shouldRetry } from '../../src/lib/query-client';

describe('error handling', () => {
  it('when a save meets a newer version, then the message says nothing was overwritten', () => {
    const error = new ApiError(409, 'STALE_VERSION', 'version 3 is not the current version 4');
    expect(isStaleVersion(error)).toBe(true);
    expect(errorMessage(error)).toMatch(/someone else changed this/i);
    expect(errorMessage(error)).toMatch(/not saved/i);
  });

  it('when a project is not visible (404), then it is treated as not found, and 401 as signed out', () => {
    expect(isNotFound(new ApiError(404, 'NOT_FOUND', 'x'))).toBe(true);
    expect(isNotFound(new ApiError(403, 'FORBIDDEN', 'x'))).toBe(false);
    expect(isSignedOut(new ApiError(401, 'NOT_SIGNED_IN', 'x'))).toBe(true);
  });

  it('when the server names a broken rule (CONFLICT), then its own message is shown; unknown codes fall back to it too', () => {
    expect(errorMessage(new ApiError(409, 'CONFLICT', 'Already a member of this project'))).toBe('Already a member of this project');
    expect(errorMessage(new ApiError(418, 'SOMETHING_NEW', 'A new rule'))).toBe('A new rule');
    expect(errorMessage(new Error('boom'))).toMatch(/boom/);
  });

  it('when a query fails, then 4xx answers are not retried and network or 5xx failures are retried at most twice', () => {
    expect(shouldRetry(0, new ApiError(404, 'NOT_FOUND', ''))).toBe(false);
    expect(shouldRetry(0, new ApiError(401, 'NOT_SIGNED_IN', ''))).toBe(false);
    expect(shouldRetry(0, new ApiError(503, 'DATABASE_UNAVAILABLE', ''))).toBe(true);
    expect(shouldRetry(1, new ApiError(0, 'NETWORK', ''))).toBe(true);
    expect(shouldRetry(2, new ApiError(0, 'NETWORK', ''))).toBe(false);
  });

  it('when a 400 names fields, then each named field of the form gets its message and unknown paths are ignored', () => {
    const set: Array<[string, string | undefined]> = [];
    const setError = ((name: string, error: { message?: string }) => set.push([name, error.message])) as never;
    const error = new ApiError(400, 'VALIDATION_FAILED', 'Check the fields', { name: 'Enter a project name', other: 'ignored' });
    expect(applyServerFieldErrors(error, setError, ['name', 'address'])).toBe(true);
    expect(set).toEqual([['name', 'Enter a project name']]);
    expect(applyServerFieldErrors(new ApiError(409, 'STALE_VERSION', ''), setError, ['name'])).toBe(false);
  });
});
