/**
 * The riser diagram page through its real route, on the invented demo "Alder & Finch" (cold water,
 * US units): it fits its container's width (the SVG scales to 100 % and every drawn element lies
 * inside its view box), and it names the demo's devices and levels, on the drawing and in the key.
 * Expected names come from the document and the shared layout run here, never written in the test.
 */
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, nodeElevations, UNIT_LABELS, type SystemDocument } from '../../src/engine';
import { CHAR_EM, DEVICE_TAG_WORDS, riserDiagram } from '../../src/shared/diagram/riserLayout';
import { num, signed } from '../../src/shared/format/quantity';
import { walkPaths } from '../../src/features/walk/paths';
import { demoDocument, fakeApi } from './support/fake-api';
import { renderWalk } from './support/render-walk';

const doc = demoDocument();
const analysis = analyzeSystem(doc);
const diagram = riserDiagram(doc, analysis);
const u = UNIT_LABELS[doc.unitSystem];

/** The same building with every node at its absolute elevation and no named floors (as a system entered without floors). */
function withoutFloors(d: SystemDocument): SystemDocument {
  const z = nodeElevations(d);
  return {
    ...d,
    floors: [],
    nodes: d.nodes.map(({ floor: _floor, heightAboveFloor: _height, ...n }) => ({ ...n, elevation: z.get(n.id)! })),
  };
}

/** "translate(12.5,40) rotate(-90)" → [12.5, 40] */
const translateOf = (transform: string | null) => {
  const m = /translate\(([-\d.e]+),([-\d.e]+)\)/.exec(transform ?? '');
  return m ? [Number(m[1]), Number(m[2])] : null;
};

describe('the riser diagram page', () => {
  it('when the demo’s diagram is opened, then its SVG fits the container’s width with every element inside, and it names each device and level', async () => {
    const world = fakeApi();
    await renderWalk(world, walkPaths.diagram.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId));
    const svg = (await screen.findByTestId('riser-diagram', undefined, { timeout: 20_000 })) as unknown as SVGSVGElement;

    // fit to width is the default: the SVG takes the container's width and scales its view box
    expect(svg.getAttribute('data-fit')).toBe('width');
    expect(svg.getAttribute('width')).toBe('100%');
    expect(svg.getAttribute('height')).toBeNull();
    expect(svg.getAttribute('preserveAspectRatio')).toBe('xMinYMin meet');
    const [vx, vy, vw, vh] = svg.getAttribute('viewBox')!.split(' ').map(Number);
    const inside = (x: number, y: number, what: string) => {
      // 0.01 pt: rounding of the arithmetic only
      expect(x, `${what}: x`).toBeGreaterThanOrEqual(vx - 0.01);
      expect(x, `${what}: x`).toBeLessThanOrEqual(vx + vw + 0.01);
      expect(y, `${what}: y`).toBeGreaterThanOrEqual(vy - 0.01);
      expect(y, `${what}: y`).toBeLessThanOrEqual(vy + vh + 0.01);
    };
    const lines = [...svg.querySelectorAll('line')];
    expect(lines.length).toBeGreaterThanOrEqual(diagram.pipes.length);
    for (const l of lines) {
      inside(Number(l.getAttribute('x1')), Number(l.getAttribute('y1')), 'line start');
      inside(Number(l.getAttribute('x2')), Number(l.getAttribute('y2')), 'line end');
    }
    for (const r of svg.querySelectorAll('rect')) {
      const [x, y, w, h] = ['x', 'y', 'width', 'height'].map((k) => Number(r.getAttribute(k)));
      inside(x, y, 'device box');
      inside(x + w, y + h, 'device box');
    }
    // a text by the layout's width bound (0.62 em a character) and its ascent (0.8 em)
    for (const t of svg.querySelectorAll('text')) {
      const size = Number(t.getAttribute('font-size'));
      const width = (t.textContent ?? '').length * size * CHAR_EM;
      const at = translateOf(t.getAttribute('transform'));
      const what = `"${t.textContent}"`;
      if (at) {
        // rotated a quarter turn: it runs upward from its point
        inside(at[0] - size * 0.8, at[1] - width, what);
        inside(at[0], at[1], what);
      } else {
        const x = Number(t.getAttribute('x'));
        const y = Number(t.getAttribute('y'));
        inside(x, y - size * 0.8, what);
        inside(x + width, y, what);
      }
    }

    // every device by its tag and name (a name shortened on the drawing keeps its wording as its title)
    const drawn = svg.textContent ?? '';
    for (const d of diagram.devices) {
      expect(drawn).toContain(d.label);
      expect([...svg.querySelectorAll('text')].some((t) => t.textContent === d.tag)).toBe(true);
      expect(screen.getByTestId('riser-devices').textContent).toContain(`${d.tag} ${d.label} — ${d.floor}`);
    }
    expect(diagram.devices.map((d) => d.tag)).toEqual(expect.arrayContaining(['M', 'BFP', 'BP', 'PRV']));
    for (const tag of new Set(diagram.devices.map((d) => d.tag))) expect(screen.getByText(/Devices:/).textContent).toContain(`${tag} ${DEVICE_TAG_WORDS[tag]}`);
    // every level by its name, on the drawing and in full in the key
    expect(diagram.levels.length).toBeGreaterThan(3);
    for (const l of diagram.levels) {
      expect(drawn).toContain(l.name);
      expect(screen.getByTestId('riser-levels').textContent).toContain(l.name);
    }
    // every pipe's size and material where the layout has room: the demo's copper risers
    expect([...svg.querySelectorAll('text')].filter((t) => / Cu L$/.test(t.textContent ?? '')).length).toBeGreaterThan(5);

    // each checked fixture: its margin and verdict written beside it and listed in the key
    for (const f of analysis.fixtures) {
      const mark = screen.getByTestId(`diagram-fixture-${f.id}`);
      expect(mark.querySelector('text')?.textContent).toContain(`${signed(f.margin, u.pressure)} ${f.pass ? 'pass' : 'FAIL'}`);
      expect(screen.getByTestId(`key-fixture-${f.id}`).textContent).toContain(
        `${f.label}: ${signed(f.margin, u.pressure)} ${u.pressure} ${f.pass ? 'pass' : 'FAIL'}`,
      );
    }
    expect(world.unknown).toEqual([]);
  });

  it('when the system sits on named floors, then the diagram’s levels are its floors, by name and elevation, from the lowest up', async () => {
    const world = fakeApi();
    await renderWalk(world, walkPaths.diagram.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId));
    const svg = await screen.findByTestId('riser-diagram', undefined, { timeout: 20_000 });
    const floors = [...doc.floors].sort((a, b) => a.elevation - b.elevation);
    expect(floors.length).toBeGreaterThan(3);
    const key = screen.getByTestId('riser-levels').textContent ?? '';
    const listed = key
      .replace(/^Levels:\s*/, '')
      .replace(/\.$/, '')
      .split('; ');
    expect(listed).toEqual(floors.map((f) => `${f.name} (el. ${num(f.elevation, u.length)} ${u.length})`));
    // each floor's name is drawn on its level line
    const texts = [...svg.querySelectorAll('text')].map((t) => t.textContent);
    for (const f of floors) expect(texts).toContain(f.name);
    // the devices are listed on the floor they sit on (the riser PRVs on their own floors)
    const devices = screen.getByTestId('riser-devices').textContent ?? '';
    for (const d of diagram.devices) expect(floors.map((f) => f.name)).toContain(d.floor);
    expect(devices).toContain(`— ${floors[0].name}`);
    expect(world.unknown).toEqual([]);
  });

  it('when the system names no floors, then the diagram’s levels are the points its risers reach, by name', async () => {
    const flat = withoutFloors(doc);
    // the same building, the same analysis: only the way its nodes are placed differs
    expect(analyzeSystem(flat).fixtures.map((f) => f.residual)).toEqual(analysis.fixtures.map((f) => f.residual));
    const world = fakeApi({ document: flat });
    await renderWalk(world, walkPaths.diagram.getHref(world.ids.projectId, world.ids.systemId, world.ids.revisionId));
    await screen.findByTestId('riser-diagram', undefined, { timeout: 20_000 });
    const levels = riserDiagram(flat, analyzeSystem(flat)).levels;
    expect(levels.length).toBeGreaterThan(3);
    const key = screen.getByTestId('riser-levels').textContent ?? '';
    const nodeNames = new Set(flat.nodes.map((n) => n.label ?? n.id));
    const floorNames = new Set(doc.floors.map((f) => f.name));
    for (const l of levels) {
      expect(nodeNames.has(l.name), l.name).toBe(true);
      expect(floorNames.has(l.name), l.name).toBe(false);
      expect(key).toContain(`${l.name} (el. ${num(l.elevation, u.length)} ${u.length})`);
    }
    expect(world.unknown).toEqual([]);
  });
});
