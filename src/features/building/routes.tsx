/**
 * The building page, a child of the walk's revision frame (it edits the same draft, saved the same
 * way, with the frame's save bar): spread into the revision route's children. Loaded lazily.
 */
import type { RouteObject } from 'react-router-dom';
import { buildingPaths } from './paths';

export const buildingRevisionRoutes: RouteObject[] = [
  { path: buildingPaths.building.path, lazy: async () => ({ Component: (await import('./pages/building-page')).BuildingPage }) },
];
