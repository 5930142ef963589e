import { afterEach, describe, expect, it, vi } from 'vitest';
import { QueryClient } from '@tanstack/react-query';
import { matchPath, matchRoutes } from 'react-router-dom';
import type { RouteObject } from 'react-router-dom';
import { isSafeRedirect, paths } from '../../src/app/paths';
import { appRoutes } from '../../src/app/router';
import { api } from '../../src/lib/api-client';
import { walkPaths } from '../../src/features/walk/paths';
import { summaryPaths } from '../../src/features/summaries/paths';
import { catalogPaths } from '../../src/features/catalog/paths';
import { fieldChangePaths } from '../../src/features/field-changes/paths';
import { buildingPaths } from '../../src/features/building/paths';
import { fieldChangeViewPath } from '../../src/shared/api/fieldChanges';

function allPatterns(list: RouteObject[]): string[] {
  return list.flatMap((route) => [...(route.path ? [route.path] : []), ...allPatterns(route.children ?? [])]);
}

// the app's table and the features' own tables (a feature composes its routes from its table)
const TABLE_PATTERNS = [
  ...Object.values(paths),
  ...Object.values(walkPaths),
  ...Object.values(summaryPaths),
  ...Object.values(fieldChangePaths),
  ...Object.values(catalogPaths),
  ...Object.values(buildingPaths),
].map((entry) => entry.path);

const routes = appRoutes(new QueryClient());

describe('route table', () => {
  it('when the router is built, then every route path comes from the paths table (or is the catch-all)', () => {
    const used = allPatterns(routes);
    for (const pattern of used) expect([...TABLE_PATTERNS, '*']).toContain(pattern);
    for (const pattern of TABLE_PATTERNS) expect(used).toContain(pattern);
  });

  it('when a link is made for an id with awkward characters, then it matches its own route and gives the id back', () => {
    const awkward = 'a b/c?d#e';
    // matchRoutes decodes the address the way the browser router does before matching.
    const project = matchRoutes(routes, paths.project.getHref(awkward))?.at(-1);
    expect(project?.route.path).toBe(paths.project.path);
    expect(project?.params.projectId).toBe(awkward);
    const invitation = matchPath(paths.invitation.path, paths.invitation.getHref('tok_-9'));
    expect(invitation?.params.token).toBe('tok_-9');
  });

  it('when an address is matched, then it reaches the intended page and unknown addresses reach the catch-all', () => {
    const leaf = (url: string) => matchRoutes(routes, url)?.at(-1)?.route.path;
    expect(leaf('/projects')).toBe(paths.projects.path);
    expect(leaf('/projects/new')).toBe(paths.newProject.path);
    expect(leaf('/projects/3f1c')).toBe(paths.project.path);
    expect(leaf('/users')).toBe(paths.users.path);
    expect(leaf(catalogPaths.projectCatalog.getHref('3f1c'))).toBe(catalogPaths.projectCatalog.path);
    expect(leaf('/sign-in')).toBe(paths.signIn.path);
    expect(leaf('/invitations/xyz')).toBe(paths.invitation.path);
    expect(leaf('/forgot-password')).toBe(paths.forgotPassword.path);
    expect(leaf(paths.resetPassword.getHref('tok_-9'))).toBe(paths.resetPassword.path);
    expect(leaf('/no/such/page')).toBe('*');
    // a field change's side by side (the address its e-mails link to), a step of it, and its diagram
    const view = matchRoutes(routes, fieldChangeViewPath('p1', 's1', 'f1')) ?? [];
    expect(view.at(-1)?.route.index).toBe(true);
    expect(view.at(-2)?.route.path).toBe(fieldChangePaths.view.path);
    expect(leaf(fieldChangePaths.step.getHref('p1', 's1', 'f1', 'pipe'))).toBe(fieldChangePaths.step.path);
    expect(fieldChangePaths.step.getHref('p1', 's1', 'f1', 'effect')).toBe(fieldChangeViewPath('p1', 's1', 'f1'));
    expect(leaf(fieldChangePaths.diagram.getHref('p1', 's1', 'f1'))).toBe(fieldChangePaths.diagram.path);
  });

  it('when sign-in is given a place to return to, then only same-site paths are kept', () => {
    expect(paths.signIn.getHref('/projects/p1')).toBe('/sign-in?redirectTo=%2Fprojects%2Fp1');
    expect(paths.signIn.getHref('//evil.example/x')).toBe('/sign-in');
    expect(paths.signIn.getHref('https://evil.example')).toBe('/sign-in');
    expect(paths.signIn.getHref('/sign-in')).toBe('/sign-in');
    expect(isSafeRedirect('/\\evil.example')).toBe(false);
    expect(isSafeRedirect('/users')).toBe(true);
  });
});

describe('route loaders', () => {
  afterEach(() => vi.unstubAllGlobals());

  /** Runs the loaders of every route an address matches, as the router does, and returns the API paths they asked for. */
  async function requestedBy(url: string): Promise<string[]> {
    const asked: string[] = [];
    // an API that never answers: what matters is what was asked, and that the loaders did not wait
    vi.stubGlobal('fetch', (input: RequestInfo | URL) => {
      asked.push(new URL(String(input), 'http://headroom.test').pathname);
      return new Promise<Response>(() => {});
    });
    api.resetCsrfToken();
    const matches = matchRoutes(appRoutes(new QueryClient()), url) ?? [];
    for (const m of matches) {
      const loader = m.route.loader;
      if (typeof loader === 'function') expect(await loader({ params: m.params } as never, undefined as never)).toBeNull();
    }
    return asked;
  }

  it('when a revision’s step is opened, then its loaders have asked for the project, the system, the revision and the catalog before the page’s code is loaded', async () => {
    const asked = await requestedBy(walkPaths.step.getHref('p1', 's1', 'r1', 'supply'));
    expect(asked).toEqual(
      expect.arrayContaining(['/api/projects/p1', '/api/projects/p1/systems/s1', '/api/projects/p1/systems/s1/revisions/r1', '/api/catalog']),
    );
  });

  it('when a field change is opened, then its loader has asked for the field change beside the project and system', async () => {
    const asked = await requestedBy(fieldChangePaths.view.getHref('p1', 's1', 'f1'));
    expect(asked).toEqual(expect.arrayContaining(['/api/projects/p1', '/api/projects/p1/systems/s1', '/api/projects/p1/systems/s1/field-changes/f1']));
  });
});
