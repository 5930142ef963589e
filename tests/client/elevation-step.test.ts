/**
 * The walk's elevation step on a document whose nodes sit on named floors (the demo, the riser
 * builder's buildings): the form shows each such node at its floor + height, and writing the form
 * back leaves every node whose value was not changed on its floor; a changed value places that node
 * by an absolute elevation (one position per node, document version 2).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { SystemDocumentSchema } from '../../src/engine';
import { applyElevations } from '../../src/features/walk/steps/elevation-step';

const demo = SystemDocumentSchema.parse(JSON.parse(readFileSync(new URL('../../src/engine/examples/alder-finch-cold.json', import.meta.url), 'utf8')));
const floorZ = new Map(demo.floors.map((f) => [f.id, f.elevation]));
const shown = (n: (typeof demo.nodes)[number]) => n.elevation ?? (n.floor !== undefined ? floorZ.get(n.floor)! + (n.heightAboveFloor ?? 0) : undefined);

describe('applyElevations on nodes placed on floors', () => {
  it('when the form is written back unchanged, then every node stays where it was placed', () => {
    const v = { nodes: demo.nodes.map((n) => ({ id: n.id, elevation: shown(n) })), segments: demo.segments.map((s) => ({ id: s.id, rise: s.rise })) };
    expect(demo.nodes.some((n) => n.floor !== undefined)).toBe(true);
    expect(applyElevations(demo, v)).toStrictEqual(demo);
  });

  it('when one node on a floor gets another elevation, then only that node leaves its floor', () => {
    const target = demo.nodes.find((n) => n.floor !== undefined && (n.heightAboveFloor ?? 0) > 0)!;
    const v = {
      nodes: demo.nodes.map((n) => ({ id: n.id, elevation: n.id === target.id ? shown(n)! + 1 : shown(n) })),
      segments: demo.segments.map((s) => ({ id: s.id, rise: s.rise })),
    };
    const out = applyElevations(demo, v);
    const moved = out.nodes.find((n) => n.id === target.id)!;
    expect(moved.elevation).toBe(shown(target)! + 1);
    expect(moved.floor).toBeUndefined();
    expect(moved.heightAboveFloor).toBeUndefined();
    expect(out.nodes.filter((n) => n.id !== target.id)).toStrictEqual(demo.nodes.filter((n) => n.id !== target.id));
  });
});
