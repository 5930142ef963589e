/**
 * Each class of bad input returns its structured error, naming the element and the field.
 * (Behaviour of the engine's own contract; no published source applies.)
 */
import { describe, expect, it } from 'vitest';
import { analyzeSystem, safeAnalyzeSystem, EngineInputError, type ErrorCode } from '../../../src/engine';
import { clone, oneSegment, smallTree } from '../support/docs';

function expectError(doc: unknown, code: ErrorCode, elementType: string, elementId: string | null, field?: string | null) {
  const r = safeAnalyzeSystem(doc);
  expect(r.ok).toBe(false);
  if (r.ok) return;
  expect(r.error).toBeInstanceOf(EngineInputError);
  expect(r.error.code).toBe(code);
  expect(r.error.elementType).toBe(elementType);
  expect(r.error.elementId).toBe(elementId);
  if (field !== undefined) expect(r.error.field).toBe(field);
  expect(r.error.message.length).toBeGreaterThan(10);
  // The JSON form carries the same facts (what the CLI and the API print).
  expect(r.error.toJSON()).toMatchObject({ code, elementType, elementId });
}

describe('bad input → structured error', () => {
  it('a cycle (a loop not reached from the source)', () => {
    const d = clone(smallTree());
    d.nodes.push({ id: 'x', elevation: 0 }, { id: 'y', elevation: 0 });
    d.segments.push(
      { id: 'xy', from: 'x', to: 'y', material: 'copper-l', size: '1', length: 1 },
      { id: 'yx', from: 'y', to: 'x', material: 'copper-l', size: '1', length: 1 },
    );
    const r = safeAnalyzeSystem(d);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.code).toBe('cycle');
      expect(r.error.elementType).toBe('segment');
      expect(['xy', 'yx']).toContain(r.error.elementId);
    }
  });

  it('a loop through the tree (a node fed twice)', () => {
    const d = clone(smallTree());
    d.segments.push({ id: 'dc', from: 'd', to: 'c', material: 'copper-l', size: '1', length: 3 });
    expectError(d, 'multiple-feeds', 'node', 'c');
  });

  it('a segment into the source', () => {
    const d = clone(smallTree());
    d.segments.push({ id: 'back', from: 'c', to: 'src', material: 'copper-l', size: '1', length: 3 });
    expectError(d, 'source-has-feed', 'segment', 'back', 'to');
  });

  it('a disconnected segment is not an error (document version 2): the verdict is incomplete and names the part', () => {
    // Before version 2 this was the error disconnected-segment; a part not yet connected is now a
    // description in progress, so the analysis runs and never shows green.
    const d = clone(smallTree());
    d.nodes.push({ id: 'p', label: 'Island start', elevation: 0 }, { id: 'q', elevation: 0 });
    d.segments.push({ id: 'pq', from: 'p', to: 'q', material: 'copper-l', size: '1', length: 3 });
    const a = analyzeSystem(d);
    expect(a.verdict.status).toBe('incomplete');
    const reason = a.verdict.incomplete.find((r) => r.code === 'part-unreachable')!;
    expect(reason.message).toBe('2 nodes and 1 segment are not connected to the source, starting with "Island start": connect them or remove them.');
  });

  it('no source node', () => {
    const d = clone(smallTree());
    d.source.nodeId = 'nowhere';
    expectError(d, 'no-source', 'source', 'nowhere', 'nodeId');
  });

  it('a missing source object', () => {
    const d = clone(smallTree()) as Record<string, unknown>;
    delete d.source;
    expectError(d, 'missing-field', 'source', null, 'source');
  });

  it('a negative length', () => {
    const d = clone(smallTree());
    d.segments[2].length = -4;
    expectError(d, 'non-positive-length', 'segment', 'sc', 'length');
  });

  it('a zero inside diameter', () => {
    const d = clone(smallTree());
    const seg = d.segments[1];
    delete seg.material;
    delete seg.size;
    seg.custom = { innerDiameter: 0, roughness: 0.0015, hazenWilliamsC: 140, velocityClass: 'copper' };
    expectError(d, 'non-positive-diameter', 'segment', 'sb', 'innerDiameter');
  });

  it('an unknown material', () => {
    const d = clone(smallTree());
    d.segments[0].material = 'unobtainium';
    expectError(d, 'unknown-catalog-entry', 'segment', 'sa', 'material');
  });

  it('an unknown size, fitting type and fixture type', () => {
    const a = clone(smallTree());
    a.segments[0].size = '7/16';
    expectError(a, 'unknown-catalog-entry', 'segment', 'sa', 'size');
    const b = clone(smallTree());
    b.segments[1].fittings = [{ typeId: 'elbow-made-up', count: 1 }];
    expectError(b, 'unknown-catalog-entry', 'fitting', 'sb', 'typeId');
    const c = clone(smallTree());
    c.nodes[2].checkedFixtures = [{ id: 'z', fixtureTypeId: 'jacuzzi-9000' }];
    expectError(c, 'unknown-catalog-entry', 'checked-fixture', 'z', 'fixtureTypeId');
  });

  it('NaN and Infinity', () => {
    const a = clone(smallTree());
    a.segments[3].length = Number.NaN;
    expectError(a, 'non-finite-number', 'segment', 'sd', 'length');
    const b = clone(smallTree());
    b.nodes[1].elevation = Number.POSITIVE_INFINITY;
    expectError(b, 'non-finite-number', 'node', 'a', 'elevation');
  });

  it('a missing field names the element', () => {
    const d = clone(smallTree()) as { segments: Record<string, unknown>[] };
    delete d.segments[1].length;
    expectError(d, 'missing-field', 'segment', 'sb', 'length');
  });

  it('a misspelt field is a schema violation', () => {
    const d = clone(smallTree()) as { segments: Record<string, unknown>[] };
    d.segments[0].lenght = 3;
    expectError(d, 'schema-violation', 'segment', 'sa');
  });

  it('an unknown node reference', () => {
    const d = clone(smallTree());
    d.segments[1].to = 'ghost';
    expectError(d, 'unknown-node', 'segment', 'sb', 'to');
  });

  it('a PRV without a set pressure, and a device on an unknown segment', () => {
    const d = clone(oneSegment());
    d.devices = [{ id: 'v', kind: 'prv', label: 'PRV', segmentId: 's1', loss: { kind: 'fixed', loss: 0 } }];
    expectError(d, 'missing-field', 'device', 'v', 'prv');
    const e = clone(oneSegment());
    e.devices = [{ id: 'm', kind: 'meter', label: 'Meter', segmentId: 'nope', loss: { kind: 'fixed', loss: 1 } }];
    expectError(e, 'unknown-segment', 'device', 'm', 'segmentId');
  });

  it('a water temperature outside liquid water at 1 atm', () => {
    const d = clone(oneSegment());
    d.waterTemperature = 120;
    expectError(d, 'value-out-of-range', 'system', 'one', 'waterTemperature');
  });

  it('duplicate ids', () => {
    const d = clone(smallTree());
    d.segments[3].id = 'sa';
    expectError(d, 'duplicate-id', 'segment', 'sa', 'id');
  });

  it('analyzeSystem throws the same error', () => {
    const d = clone(smallTree());
    d.segments[2].length = 0;
    expect(() => analyzeSystem(d)).toThrow(EngineInputError);
  });

  it('not an object at all', () => {
    for (const bad of [null, 42, 'system', []]) {
      const r = safeAnalyzeSystem(bad);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.error.code).toBe('schema-violation');
    }
  });
});

describe('positions (document version 2)', () => {
  it('a node on a floor sits at the floor elevation plus its height above it', () => {
    const d = clone(oneSegment());
    d.floors = [{ id: 'L2', name: 'Level 2', elevation: 2.5 }];
    delete d.nodes[1].elevation;
    d.nodes[1].floor = 'L2';
    d.nodes[1].heightAboveFloor = 0.9;
    const a = analyzeSystem(d);
    expect(a.nodes[1].elevation).toBe(2.5 + 0.9);
    expect(a.verdict.status).toBe('pass');
  });

  it('a node naming a floor that does not exist', () => {
    const d = clone(oneSegment());
    delete d.nodes[1].elevation;
    d.nodes[1].floor = 'L9';
    expectError(d, 'unknown-floor', 'node', 'end', 'floor');
  });

  it('a node with both an elevation and a floor', () => {
    const d = clone(oneSegment());
    d.floors = [{ id: 'L2', name: 'Level 2', elevation: 2.5 }];
    d.nodes[1].floor = 'L2';
    expectError(d, 'node-position-conflict', 'node', 'end', 'floor');
  });

  it('a height above floor without a floor', () => {
    const d = clone(oneSegment());
    d.nodes[1].heightAboveFloor = 1;
    expectError(d, 'node-position-conflict', 'node', 'end', 'heightAboveFloor');
  });

  it('a rise on the feed of a node on a floor', () => {
    const d = clone(oneSegment());
    d.floors = [{ id: 'L2', name: 'Level 2', elevation: 2.5 }];
    delete d.nodes[1].elevation;
    d.nodes[1].floor = 'L2';
    d.segments[0].rise = 2.5;
    expectError(d, 'rise-and-elevation', 'segment', 's1', 'rise');
  });

  it('two floors with one id', () => {
    const d = clone(oneSegment());
    d.floors = [
      { id: 'L2', name: 'Level 2', elevation: 2.5 },
      { id: 'L2', name: 'Level 2 again', elevation: 5 },
    ];
    expectError(d, 'duplicate-id', 'floor', 'L2', 'id');
  });
});
