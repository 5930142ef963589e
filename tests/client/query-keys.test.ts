import { describe, expect, it } from 'vitest';
import { QueryClient } from '@tanstack/react-query';
import { authKeys } from '../../src/features/auth/api/keys';
import { onSessionChanged } from '../../src/features/auth/api/session-change';
import { memberKeys } from '../../src/features/members/api/keys';
import { projectKeys } from '../../src/features/projects/api/keys';
import { userKeys } from '../../src/features/users/api/keys';

const startsWith = (key: readonly unknown[], prefix: readonly unknown[]) => prefix.every((part, i) => key[i] === part);

describe('query-key factories', () => {
  it('when features are compared, then each has its own root, so invalidating one never touches another', () => {
    const roots = [authKeys.all, projectKeys.all, memberKeys.all, userKeys.all].map((k) => k[0]);
    expect(new Set(roots).size).toBe(roots.length);
  });

  it('when a key is made, then it sits under its feature root and its group, so group invalidation reaches it', () => {
    expect(startsWith(projectKeys.detail('p1'), projectKeys.details())).toBe(true);
    expect(startsWith(projectKeys.details(), projectKeys.all)).toBe(true);
    expect(startsWith(projectKeys.lists(), projectKeys.all)).toBe(true);
    expect(startsWith(memberKeys.list('p1'), memberKeys.lists())).toBe(true);
    expect(startsWith(authKeys.invitation('t'), authKeys.invitations())).toBe(true);
    expect(startsWith(userKeys.lists(), userKeys.all)).toBe(true);
  });

  it('when two projects are cached, then their keys differ and a list key is not a detail key', () => {
    expect(projectKeys.detail('p1')).not.toEqual(projectKeys.detail('p2'));
    expect(startsWith(projectKeys.lists(), projectKeys.details())).toBe(false);
    expect(memberKeys.list('p1')).not.toEqual(memberKeys.list('p2'));
  });

  it('when the person changes (sign-in, sign-out), then everything cached for the previous person is dropped', async () => {
    const client = new QueryClient();
    client.setQueryData(projectKeys.lists(), ['secret project']);
    client.setQueryData(memberKeys.list('p1'), ['member']);
    client.setQueryData(userKeys.lists(), ['user']);
    client.setQueryData(authKeys.invitation('t'), { email: 'x' });
    onSessionChanged(client, null);
    expect(client.getQueryData(projectKeys.lists())).toBeUndefined();
    expect(client.getQueryData(memberKeys.list('p1'))).toBeUndefined();
    expect(client.getQueryData(userKeys.lists())).toBeUndefined();
    expect(client.getQueryData(authKeys.me())).toBeNull();
  });
});
