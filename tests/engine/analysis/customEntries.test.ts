/**
 * A project's own fitting and fixture data copied into a document (FittingSchema.custom,
 * FixtureGroupSchema.custom): the loss and demand rules stated in src/engine/model/schema.ts.
 *
 * The fitting checks hold the engine to the textbook definitions of a loss coefficient and an
 * equivalent length — ΔP = K·ρV²/2 and K = f·L/D (Crane Co., Technical Paper No. 410, 2009,
 * eq. 2-2 and the resistance-coefficient chapter; common practice) — evaluated with the engine's
 * own velocity, density and friction factor, so they are [COMP] consistency checks of one rule,
 * not published values. The fixture checks compare a custom group with the catalog type carrying
 * the same numbers (IPC 2018 Table E103.3(2), lavatory and flush-valve water closet rows, via
 * src/engine/catalog/fixtures.ts): the two analyses must be identical.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeSystem, EngineInputError, ledgerFor, systemDocumentJsonSchema, type Analysis } from '../../../src/engine';
import { FIXTURE_TYPES } from '../../../src/engine/catalog/fixtures';
import { IPC_E103_3_5 } from '../../../src/engine/fittings';
import type { SystemDocumentInput } from '../../../src/engine/model/schema';
import { waterProperties } from '../../../src/engine/water';
import { expectClose } from '../../helpers/expectClose';
import { clone, oneSegment, smallTree } from '../support/docs';

/** Density the engine uses at the documents' 20 °C (IAPWS-95 via src/engine/water.ts; 998.21 kg/m³ in the IAPWS tables). */
const RHO_20C = waterProperties(20).density;

const SOURCE = 'maker data sheet (invented for the test)';

/** The single-segment system with its fittings replaced. */
function withFittings(fittings: NonNullable<SystemDocumentInput['segments'][number]['fittings']>, criteria?: SystemDocumentInput['criteria']) {
  const d = clone(oneSegment());
  d.segments[0].fittings = fittings;
  if (criteria) d.criteria = criteria;
  return d;
}

/** ρV²/2 of the single segment, from the engine's own velocity and the same density it used. */
function dynamicPressure(a: Analysis, rho: number): number {
  const V = a.si.segments[0].velocity;
  return 0.5 * rho * V * V;
}

describe('custom fitting with a K', () => {
  it('adds count·K to the segment K and loses count·K·ρV²/2, under every fitting method', () => {
    for (const fittingMethod of ['crane', 'hooper-2k', 'darby-3k', 'equivalent-length'] as const) {
      const a = analyzeSystem(
        withFittings([{ typeId: 'project:ball', count: 3, custom: { label: 'Ball valve', k: 0.05, source: SOURCE } }], { fittingMethod }),
      );
      const s = a.si.segments[0];
      // Exact: the engine sums count·K into the segment K (no size change on a first segment).
      expect(s.fittingsK).toBe(3 * 0.05);
      expect(s.totalK).toBe(3 * 0.05);
      // The loss is the definition ΔP = K·ρV²/2 with the engine's velocity and its water
      // density at 20 °C (waterProperties, IAPWS-95): the same operations in the same order, exact.
      expect(s.fittingLoss).toBe(3 * 0.05 * dynamicPressure(a, RHO_20C));
    }
  });

  it('the ledger line of the fittings says the segment uses project data, and still adds up bit for bit', () => {
    const a = analyzeSystem(withFittings([{ typeId: 'project:ball', count: 1, custom: { label: 'Ball valve', k: 0.7, source: SOURCE } }]));
    const ledger = ledgerFor(a, 'lav');
    expect(ledger.lines.find((l) => l.kind === 'fittings')!.label).toBe('s1: fittings (incl. project data)');
    expect(ledger.residualSI).toBe(a.si.fixtures[0].residual);
    expect(ledgerFor(analyzeSystem(oneSegment()), 'lav').lines.find((l) => l.kind === 'fittings')!.label).toBe('s1: fittings');
  });

  it('adds to the catalog fittings of the same segment, which keep their own K', () => {
    const catalogOnly = analyzeSystem(oneSegment()).si.segments[0];
    const both = analyzeSystem(
      withFittings([
        { typeId: 'elbow-90-standard', count: 2 },
        { typeId: 'project:ball', count: 1, custom: { label: 'Ball valve', k: 0.7, source: SOURCE } },
      ]),
    ).si.segments[0];
    // rtol 1e-15: one addition of different order may round in the last bit.
    expectClose(both.fittingsK, catalogOnly.fittingsK + 0.7, { rtol: 1e-15 }, 'K sum');
    expect(both.frictionLoss).toBe(catalogOnly.frictionLoss);
  });
});

describe('custom fitting with an equivalent length', () => {
  it('loses f·(L/D)·ρV²/2 with the segment friction factor (SI document, L in m)', () => {
    const a = analyzeSystem(withFittings([{ typeId: 'project:strainer', count: 2, custom: { label: 'Y-strainer', equivalentLength: 1.5, source: SOURCE } }]));
    const s = a.si.segments[0];
    const K = 2 * ((s.frictionFactor * 1.5) / s.innerDiameter);
    // The same operations as the engine in the same order: exact.
    expect(s.fittingsK).toBe(K);
    // Loss as the friction of 2 × 1.5 m more of the same pipe: f·(L/D)·ρV²/2 (Darcy–Weisbach).
    // rtol 1e-14: the friction loss is computed by the engine once, the loss here by two products.
    const perMetre = s.frictionLoss / 20;
    expectClose(s.fittingLoss, perMetre * 3, { rtol: 1e-14 }, 'loss = friction of 3 m of the pipe');
  });

  it('with the equivalent-length method, a custom length equal to the catalog row gives the catalog K (US document, ft)', () => {
    const d = clone(oneSegment());
    d.unitSystem = 'US';
    d.waterTemperature = 60;
    d.source = { kind: 'utility-main', nodeId: 'src', staticPressureLow: 60, staticPressureHigh: 60, pressureBasis: 'test' };
    d.nodes[1].elevation = 10;
    d.nodes[1].continuousDemand = 8;
    d.segments[0].length = 50;
    d.criteria = { fittingMethod: 'equivalent-length' };
    const le = IPC_E103_3_5.elbow90Standard['3/4']; // 2.5 ft, IPC Table E103.3(5) row via the fittings catalog (from memory)
    d.segments[0].fittings = [{ typeId: 'elbow-90-standard', count: 2 }];
    const catalog = analyzeSystem(d);
    d.segments[0].fittings = [{ typeId: 'project:elbow', count: 2, custom: { label: 'Elbow', equivalentLength: le, source: SOURCE } }];
    const custom = analyzeSystem(d);
    // Same f, D and length in metres (2.5 ft × 0.3048 either way): the same K, bit for bit.
    expect(custom.si.segments[0].fittingsK).toBe(catalog.si.segments[0].fittingsK);
    expect(custom.fixtures[0].residual).toBe(catalog.fixtures[0].residual);
  });
});

describe('custom fixture group', () => {
  /** Small tree with catalog lavatories at b and a flush-valve closet at d, or the same numbers as own data. */
  function tree(own: boolean): SystemDocumentInput {
    const d = clone(smallTree());
    const lav = FIXTURE_TYPES['lavatory-private'];
    const wc = FIXTURE_TYPES['water-closet-flush-valve-public'];
    expect(wc.demandCurve).toBe('flush-valve');
    d.nodes[2].fixtureGroups = own
      ? [
          {
            fixtureTypeId: 'project:lav',
            count: 4,
            custom: {
              label: 'Lavatory (project)',
              wsfuCold: lav.wsfu.cold!,
              wsfuHot: lav.wsfu.hot!,
              wsfuTotal: lav.wsfu.total,
              flushValve: false,
              source: SOURCE,
            },
          },
        ]
      : [{ fixtureTypeId: 'lavatory-private', count: 4 }];
    d.nodes[4].fixtureGroups = own
      ? [
          {
            fixtureTypeId: 'project:wc',
            count: 2,
            custom: {
              label: 'Closet (project)',
              wsfuCold: wc.wsfu.cold ?? undefined,
              wsfuHot: wc.wsfu.hot ?? undefined,
              wsfuTotal: wc.wsfu.total,
              flushValve: true,
              source: SOURCE,
            },
          },
        ]
      : [{ fixtureTypeId: 'water-closet-flush-valve-public', count: 2 }];
    return d;
  }

  it('enters the demand exactly as a catalog type with the same numbers: identical analysis', () => {
    const catalog = analyzeSystem(tree(false));
    const own = analyzeSystem(tree(true));
    expect(own.segments).toStrictEqual(catalog.segments);
    expect(own.fixtures).toStrictEqual(catalog.fixtures);
    expect(own.si).toStrictEqual(catalog.si);
    // The demand is not trivially zero: fixture units reached the source segment.
    expect(own.segments.find((s) => s.id === 'sa')!.wsfu).toBeGreaterThan(0);
    expect(own.segments.find((s) => s.id === 'sa')!.demandCurve).toBe('flush-valve');
    // The only difference: one note that the project's own data was used, naming both groups with their sources.
    const extra = own.warnings.filter((w) => w.code === 'project-data-used');
    expect(extra).toHaveLength(1);
    expect(extra[0].elementIds).toEqual(['b', 'd']);
    expect(extra[0].detail).toBe(
      `2 fixture groups at 2 nodes use the project's own data: Lavatory (project): source ${SOURCE}; Closet (project): source ${SOURCE}`,
    );
    expect(own.warnings.filter((w) => w.code !== 'project-data-used')).toStrictEqual(catalog.warnings);
  });

  it('overrides the fixture units of a catalog type it names, and counts an absent service as no load', () => {
    const d = clone(smallTree());
    d.nodes[2].fixtureGroups = [{ fixtureTypeId: 'lavatory-private', count: 1, custom: { label: 'Big lavatory', wsfuCold: 3, wsfuTotal: 4, source: SOURCE } }];
    expect(analyzeSystem(d).segments.find((s) => s.id === 'sb')!.wsfu).toBe(3);
    d.service = 'hot';
    expect(analyzeSystem(d).segments.find((s) => s.id === 'sb')!.wsfu).toBe(0);
    d.nodes[2].fixtureGroups[0].wsfuBasis = 'total';
    expect(analyzeSystem(d).segments.find((s) => s.id === 'sb')!.wsfu).toBe(4);
  });

  it("without a catalog type, Hunter's binomial method needs the flow while in use: a structured error names the group", () => {
    const d = clone(smallTree());
    d.criteria = { demandMethod: 'hunter-binomial' };
    d.nodes[2].fixtureGroups = [
      {
        fixtureTypeId: 'project:lav',
        count: 2,
        usage: { durationSeconds: 10, recurrenceSeconds: 600 },
        custom: { label: 'Lav', wsfuTotal: 1, source: SOURCE },
      },
    ];
    try {
      analyzeSystem(d);
      expect.unreachable('should throw');
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      const err = e as EngineInputError;
      expect([err.code, err.elementType, err.elementId, err.field]).toEqual(['missing-field', 'fixture-group', 'b', 'usage.flow']);
    }
  });
});

describe('errors and old documents', () => {
  it('a fitting with both a K and an equivalent length is refused, naming the fitting', () => {
    const d = withFittings([{ typeId: 'project:x', count: 1, custom: { label: 'X', k: 1, equivalentLength: 2, source: SOURCE } as never }]);
    try {
      analyzeSystem(d);
      expect.unreachable('should throw');
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      expect((e as EngineInputError).elementType).toBe('fitting');
    }
  });

  it('an unknown catalog fitting or fixture type without own data is still refused', () => {
    expect(() => analyzeSystem(withFittings([{ typeId: 'project:x', count: 1 }]))).toThrow(/not in the fittings catalog/);
    const d = clone(smallTree());
    d.nodes[2].fixtureGroups = [{ fixtureTypeId: 'project:lav', count: 1 }];
    expect(() => analyzeSystem(d)).toThrow(/not in the fixtures catalog/);
  });

  it('a long tree whose every fitting carries project data gets one note naming how many, and each distinct entry up to the cap', () => {
    // 12 segments in a chain, each with one custom fitting; 11 distinct entries (the last two share one).
    const d = clone(oneSegment());
    const first = d.segments[0];
    d.segments = [];
    d.nodes = [d.nodes[0]];
    for (let i = 0; i < 12; i++) {
      const from = i === 0 ? first.from : `n${i}`;
      d.nodes.push({ id: `n${i + 1}`, elevation: 0 });
      d.segments.push({
        ...first,
        id: `s${i + 1}`,
        from,
        to: `n${i + 1}`,
        length: 1,
        fittings: [{ typeId: `project:v${Math.min(i, 10)}`, count: 1, custom: { label: `Valve ${Math.min(i, 10)}`, k: 0.5, source: SOURCE } }],
      });
    }
    d.nodes[d.nodes.length - 1].checkedFixtures = [{ id: 'lav', fixtureTypeId: 'lavatory-private' }];
    d.nodes[d.nodes.length - 1].continuousDemand = 0.2;
    const a = analyzeSystem(d);
    const notes = a.warnings.filter((w) => w.code === 'project-data-used');
    expect(notes).toHaveLength(1);
    expect(notes[0].elementType).toBe('fitting');
    expect(notes[0].elementIds).toEqual(d.segments.map((s) => s.id));
    // 10 distinct entries named (MAX_ENTRIES_NAMED), the 11th counted; the shared one says its uses.
    expect(notes[0].detail).toMatch(/^12 fittings on 12 segments use the project's own data: Valve 0: source /);
    expect(notes[0].detail).toContain('Valve 9: source');
    expect(notes[0].detail).not.toContain('Valve 10');
    expect(notes[0].detail).toMatch(/; and 1 more entry$/);
    // The ledger still marks every segment's fittings line, down to the last.
    const fittingsLines = ledgerFor(a, 'lav').lines.filter((l) => l.kind === 'fittings');
    expect(fittingsLines).toHaveLength(12);
    expect(fittingsLines.every((l) => l.label.endsWith('fittings (incl. project data)'))).toBe(true);
  });

  it('a document without project data has no project-data note', () => {
    expect(analyzeSystem(oneSegment()).warnings.some((w) => w.code === 'project-data-used')).toBe(false);
  });
});

describe('JSON Schema export', () => {
  it('the committed system.schema.json is the export of the zod schema and holds the custom fields', () => {
    const file = JSON.parse(readFileSync(new URL('../../../src/engine/model/system.schema.json', import.meta.url), 'utf8'));
    const { $id: _id, title: _title, ...rest } = file;
    expect(rest).toStrictEqual(systemDocumentJsonSchema());
    const fitting = file.properties.segments.items.properties.fittings.items.properties.custom;
    expect(fitting.anyOf.map((o: { required: string[] }) => o.required)).toEqual([
      ['label', 'k', 'source'],
      ['label', 'equivalentLength', 'source'],
    ]);
    expect(fitting.anyOf.every((o: { additionalProperties: boolean }) => o.additionalProperties === false)).toBe(true);
    const group = file.properties.nodes.items.properties.fixtureGroups.items.properties.custom;
    expect(group.required).toEqual(['label', 'wsfuTotal', 'source']);
    expect(Object.keys(group.properties)).toEqual(['label', 'wsfuCold', 'wsfuHot', 'wsfuTotal', 'flushValve', 'source']);
  });
});
