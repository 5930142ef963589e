/**
 * Plausible ranges enforced by the engine (analysis/ranges.ts, model/limits.ts): every numeric
 * input, set just outside its range, is refused with value-out-of-range naming the element and
 * field, through analyzeSystem and safeAnalyzeSystem; bounds on the lists refuse an oversized
 * document before any per-element work.
 */
import { describe, expect, it } from 'vitest';
import {
  analyzeSystem,
  safeAnalyzeSystem,
  EngineInputError,
  FIELD_QUANTITIES,
  LIMITS,
  DOCUMENT_BOUNDS,
  type LimitQuantity,
  type SystemDocumentInput,
} from '../../../src/engine';
import { clone, oneSegment } from '../support/docs';

type Doc = SystemDocumentInput & Record<string, unknown>;
type Case = [name: string, quantity: LimitQuantity, elementId: string | null, field: string, set: (d: Doc, v: number) => void];

/** A full document (SI) with every optional numeric field present, so every one can be pushed out of range. */
function full(): Doc {
  const d = clone(oneSegment()) as Doc;
  d.source.flowTest = { staticPressure: 420, residualPressure: 300, flow: 2 };
  d.floors = [{ id: 'L1', name: 'Level 1', elevation: 3 }];
  d.nodes.push({ id: 'onfloor', floor: 'L1', heightAboveFloor: 1 });
  d.nodes.push({ id: 'rel' });
  d.segments.push({ id: 's2', from: 'end', to: 'onfloor', material: 'copper-l', size: '1/2', length: 2 });
  d.segments.push({
    id: 's3',
    from: 'end',
    to: 'rel',
    custom: { innerDiameter: 15, roughness: 0.0015, hazenWilliamsC: 140, velocityClass: 'copper' },
    length: 2,
    rise: 1,
    flowOverride: 0.1,
    fittings: [
      { typeId: 'project:k', count: 1, custom: { label: 'Valve', k: 2, source: 'invented' } },
      { typeId: 'project:le', count: 1, custom: { label: 'Strainer', equivalentLength: 1, source: 'invented' } },
    ],
  });
  d.nodes[1].fixtureGroups = [
    {
      fixtureTypeId: 'lavatory-private',
      count: 2,
      custom: { label: 'Own lav', wsfuCold: 0.5, wsfuHot: 0.5, wsfuTotal: 0.7, source: 'invented' },
      usage: { flow: 0.1, durationSeconds: 30, recurrenceSeconds: 600 },
    },
  ];
  d.nodes[1].checkedFixtures = [{ id: 'lav', fixtureTypeId: 'lavatory-private', minFlowPressure: 55, flowRate: 0.1 }];
  d.devices = [
    { id: 'm', kind: 'meter', label: 'Meter', segmentId: 's1', loss: { kind: 'curve', points: [{ flow: 0.5, loss: 20 }] } },
    { id: 'p', kind: 'prv', label: 'PRV', segmentId: 's1', loss: { kind: 'fixed', loss: 5 }, prv: { setPressure: 400, falloffPerFlow: 10 } },
    {
      id: 'b',
      kind: 'booster-pump',
      label: 'Pump',
      segmentId: 's2',
      loss: { kind: 'fixed', loss: 0 },
      boost: { control: 'constant-speed', designGain: 100, shutoffGain: 150, designFlow: 1 },
    },
    {
      id: 'v',
      kind: 'booster-pump',
      label: 'VFD pump',
      segmentId: 's3',
      loss: { kind: 'fixed', loss: 0 },
      boost: { control: 'variable-speed', setPressure: 500 },
    },
  ];
  d.criteria = {
    maxStaticPressure: 550,
    minStaticPressure: 100,
    velocityLimits: [{ material: 'copper', service: 'cold', maxVelocity: 2.4 }],
    minFlowPressures: { 'kitchen-sink-private': 55 },
  };
  return d;
}

/** Deep writes into a generated document: each case sets one nested field whatever its declared type. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Loose = any;
const dev = (d: Doc, id: string): Loose => d.devices!.find((x) => x.id === id)!;
const seg = (d: Doc, id: string): Loose => d.segments.find((x) => x.id === id)!;
const node = (d: Doc, id: string): Loose => d.nodes.find((x) => x.id === id)!;

const CASES: Case[] = [
  [
    'water temperature',
    'waterTemperature',
    'one',
    'waterTemperature',
    (d, v) => {
      d.waterTemperature = v;
    },
  ],
  [
    'source low static',
    'staticPressure',
    'src',
    'staticPressureLow',
    (d, v) => {
      d.source.staticPressureLow = v;
    },
  ],
  [
    'source high static',
    'staticPressure',
    'src',
    'staticPressureHigh',
    (d, v) => {
      d.source.staticPressureHigh = v;
    },
  ],
  [
    'flow-test static',
    'staticPressure',
    'src',
    'flowTest.staticPressure',
    (d, v) => {
      d.source.flowTest!.staticPressure = v;
    },
  ],
  [
    'flow-test residual',
    'staticPressure',
    'src',
    'flowTest.residualPressure',
    (d, v) => {
      d.source.flowTest!.residualPressure = v;
    },
  ],
  [
    'flow-test flow',
    'flow',
    'src',
    'flowTest.flow',
    (d, v) => {
      d.source.flowTest!.flow = v;
    },
  ],
  [
    'device curve flow',
    'flow',
    'm',
    'loss.points[0].flow',
    (d, v) => {
      dev(d, 'm').loss.points[0].flow = v;
    },
  ],
  [
    'device curve loss',
    'pressureLoss',
    'm',
    'loss.points[0].loss',
    (d, v) => {
      dev(d, 'm').loss.points[0].loss = v;
    },
  ],
  [
    'device fixed loss',
    'pressureLoss',
    'p',
    'loss.loss',
    (d, v) => {
      dev(d, 'p').loss.loss = v;
    },
  ],
  [
    'PRV set pressure',
    'pressureSetting',
    'p',
    'prv.setPressure',
    (d, v) => {
      dev(d, 'p').prv.setPressure = v;
    },
  ],
  [
    'PRV fall-off',
    'pressureFalloff',
    'p',
    'prv.falloffPerFlow',
    (d, v) => {
      dev(d, 'p').prv.falloffPerFlow = v;
    },
  ],
  [
    'booster design gain',
    'pressureGain',
    'b',
    'boost.designGain',
    (d, v) => {
      dev(d, 'b').boost.designGain = v;
    },
  ],
  [
    'booster shutoff gain',
    'pressureGain',
    'b',
    'boost.shutoffGain',
    (d, v) => {
      dev(d, 'b').boost.shutoffGain = v;
    },
  ],
  [
    'booster gain (version 1 form)',
    'pressureGain',
    'b',
    'boost.gain',
    (d, v) => {
      dev(d, 'b').boost = { gain: v };
    },
  ],
  [
    'booster design flow',
    'flow',
    'b',
    'boost.designFlow',
    (d, v) => {
      dev(d, 'b').boost.designFlow = v;
    },
  ],
  [
    'booster set pressure',
    'pressureSetting',
    'v',
    'boost.setPressure',
    (d, v) => {
      dev(d, 'v').boost.setPressure = v;
    },
  ],
  [
    'floor elevation',
    'elevation',
    'L1',
    'elevation',
    (d, v) => {
      d.floors![0].elevation = v;
    },
  ],
  [
    'node elevation',
    'elevation',
    'src',
    'elevation',
    (d, v) => {
      node(d, 'src').elevation = v;
    },
  ],
  [
    'height above floor',
    'heightAboveFloor',
    'onfloor',
    'heightAboveFloor',
    (d, v) => {
      node(d, 'onfloor').heightAboveFloor = v;
    },
  ],
  [
    'continuous demand',
    'flow',
    'end',
    'continuousDemand',
    (d, v) => {
      node(d, 'end').continuousDemand = v;
    },
  ],
  [
    'fixture count',
    'fixtureCount',
    'end',
    'count',
    (d, v) => {
      node(d, 'end').fixtureGroups[0].count = v;
    },
  ],
  [
    'own cold fixture units',
    'fixtureUnits',
    'end',
    'custom.wsfuCold',
    (d, v) => {
      node(d, 'end').fixtureGroups[0].custom.wsfuCold = v;
    },
  ],
  [
    'own hot fixture units',
    'fixtureUnits',
    'end',
    'custom.wsfuHot',
    (d, v) => {
      node(d, 'end').fixtureGroups[0].custom.wsfuHot = v;
    },
  ],
  [
    'own total fixture units',
    'fixtureUnits',
    'end',
    'custom.wsfuTotal',
    (d, v) => {
      node(d, 'end').fixtureGroups[0].custom.wsfuTotal = v;
    },
  ],
  [
    'usage flow',
    'fixtureFlow',
    'end',
    'usage.flow',
    (d, v) => {
      node(d, 'end').fixtureGroups[0].usage.flow = v;
    },
  ],
  [
    'usage duration',
    'useDuration',
    'end',
    'usage.durationSeconds',
    (d, v) => {
      node(d, 'end').fixtureGroups[0].usage.durationSeconds = v;
    },
  ],
  [
    'usage recurrence',
    'useInterval',
    'end',
    'usage.recurrenceSeconds',
    (d, v) => {
      node(d, 'end').fixtureGroups[0].usage.recurrenceSeconds = v;
    },
  ],
  [
    'fixture minimum flow pressure',
    'minFlowPressure',
    'lav',
    'minFlowPressure',
    (d, v) => {
      node(d, 'end').checkedFixtures[0].minFlowPressure = v;
    },
  ],
  [
    'fixture flow rate',
    'fixtureFlow',
    'lav',
    'flowRate',
    (d, v) => {
      node(d, 'end').checkedFixtures[0].flowRate = v;
    },
  ],
  [
    'segment length',
    'length',
    's1',
    'length',
    (d, v) => {
      seg(d, 's1').length = v;
    },
  ],
  [
    'segment rise',
    'rise',
    's3',
    'rise',
    (d, v) => {
      seg(d, 's3').rise = v;
    },
  ],
  [
    'flow override',
    'flow',
    's3',
    'flowOverride',
    (d, v) => {
      seg(d, 's3').flowOverride = v;
    },
  ],
  [
    'custom inside diameter',
    'innerDiameter',
    's3',
    'custom.innerDiameter',
    (d, v) => {
      seg(d, 's3').custom.innerDiameter = v;
    },
  ],
  [
    'custom roughness',
    'roughness',
    's3',
    'custom.roughness',
    (d, v) => {
      seg(d, 's3').custom.roughness = v;
    },
  ],
  [
    'custom Hazen–Williams C',
    'hazenWilliamsC',
    's3',
    'custom.hazenWilliamsC',
    (d, v) => {
      seg(d, 's3').custom.hazenWilliamsC = v;
    },
  ],
  [
    'fitting count',
    'fittingCount',
    's1',
    'count',
    (d, v) => {
      seg(d, 's1').fittings[0].count = v;
    },
  ],
  [
    'custom fitting K',
    'lossCoefficient',
    's3',
    'custom.k',
    (d, v) => {
      seg(d, 's3').fittings[0].custom.k = v;
    },
  ],
  [
    'custom fitting equivalent length',
    'equivalentLength',
    's3',
    'custom.equivalentLength',
    (d, v) => {
      seg(d, 's3').fittings[1].custom.equivalentLength = v;
    },
  ],
  [
    'criteria maximum static',
    'staticPressure',
    null,
    'maxStaticPressure',
    (d, v) => {
      d.criteria!.maxStaticPressure = v;
    },
  ],
  [
    'criteria minimum static',
    'staticPressure',
    null,
    'minStaticPressure',
    (d, v) => {
      d.criteria!.minStaticPressure = v;
    },
  ],
  [
    'criteria velocity limit',
    'velocityLimit',
    null,
    'velocityLimits[0].maxVelocity',
    (d, v) => {
      d.criteria!.velocityLimits![0].maxVelocity = v;
    },
  ],
  [
    'criteria minimum flow pressure',
    'minFlowPressure',
    null,
    'minFlowPressures.kitchen-sink-private',
    (d, v) => {
      d.criteria!.minFlowPressures!['kitchen-sink-private'] = v;
    },
  ],
];

describe('every numeric input outside its plausible range', () => {
  it('the full document is accepted as it stands (every value inside its range)', () => {
    const r = safeAnalyzeSystem(full());
    expect(r.ok ? 'ok' : r.error.message).toBe('ok');
  });

  for (const [name, quantity, elementId, field, set] of CASES) {
    it(`${name}: just above the SI maximum → value-out-of-range naming ${field}`, () => {
      const d = full();
      const { max } = LIMITS[quantity].SI;
      // Just above: the maximum plus 1 % (plus 1 for a whole-number count).
      set(d, LIMITS[quantity].integer ? max + 1 : max * 1.01 + 1e-9);
      const r = safeAnalyzeSystem(d);
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.error.code).toBe('value-out-of-range');
        expect(r.error.elementId).toBe(elementId);
        expect(r.error.field).toBe(field);
        expect(r.error.message).toContain(`${LIMITS[quantity].noun} `);
      }
      expect(() => analyzeSystem(d)).toThrow(EngineInputError);
    });
  }

  it('the cases reach every ranged number of the description the engine checks here (all but typical units, placements, the cold feed resolution, the hot-water inputs and the sizing basis)', () => {
    const reached = new Set<string>();
    for (const [, quantity, , , set] of CASES) {
      const d = full();
      set(d, LIMITS[quantity].integer ? LIMITS[quantity].SI.max + 1 : LIMITS[quantity].SI.max * 1.01 + 1e-9);
      const r = safeAnalyzeSystem(d);
      if (r.ok) continue;
      const path = (r.error.issues?.[0]?.path ?? [])
        .map((p) => (typeof p === 'number' ? '[]' : `.${p}`))
        .join('')
        .replace(/^\./, '')
        .replaceAll('.[]', '[]');
      // A record key (a fixture type id) stands for every key of the record.
      reached.add(path in FIELD_QUANTITIES ? path : path.replace(/\.[^.[\]]+$/, '.*'));
    }
    const elsewhere = /^(unitTypes|placements|expansionTank|recirculation|sizingBasis|source\.fedFrom)\b/;
    const described = Object.keys(FIELD_QUANTITIES).filter((p) => !elsewhere.test(p));
    expect([...reached].sort()).toEqual(described.sort());
  });

  it('a US document is checked against the US bounds: 1e9 ft of length, 99,999 psi, 250 °F, −20 psi', () => {
    const us = clone(oneSegment()) as Doc;
    us.unitSystem = 'US';
    us.waterTemperature = 60;
    us.source.staticPressureLow = 50;
    us.source.staticPressureHigh = 60;
    const tries: [(d: Doc) => void, string, string][] = [
      [
        (d) => {
          d.segments[0].length = 1e9;
        },
        'length',
        'Out of range: length 0–5,000 ft (more than 0)',
      ],
      [
        (d) => {
          d.source.staticPressureHigh = 99999;
        },
        'staticPressureHigh',
        'Out of range: static pressure 0–300 psi',
      ],
      [
        (d) => {
          d.waterTemperature = 250;
        },
        'waterTemperature',
        'Out of range: water temperature 33–200 °F',
      ],
      [
        (d) => {
          d.segments[0].length = 1e308;
        },
        'length',
        'Out of range: length 0–5,000 ft (more than 0)',
      ],
    ];
    for (const [set, field, text] of tries) {
      const d = clone(us);
      set(d);
      const r = safeAnalyzeSystem(d);
      expect(r.ok).toBe(false);
      if (!r.ok) {
        expect(r.error.code).toBe('value-out-of-range');
        expect(r.error.field).toBe(field);
        expect(r.error.message).toContain(text);
      }
    }
    // A negative pressure is refused by the schema (a sign, not a magnitude).
    const neg = clone(us);
    neg.source.staticPressureLow = -20;
    const r = safeAnalyzeSystem(neg);
    expect(r.ok).toBe(false);
  });

  it('many values out of range: every one is listed up to 100, and the message counts the rest', () => {
    const d = full();
    for (let i = 0; i < 150; i++) d.nodes.push({ id: `x${i}`, elevation: 1e6 });
    const r = safeAnalyzeSystem(d);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.issues).toHaveLength(100);
      expect(r.error.message).toContain('150 values out of range; the first 100 are listed');
    }
  });
});

describe('document size bounds', () => {
  it('a list longer than any building needs is refused at once, before any per-element work', () => {
    const d = clone(oneSegment()) as Doc;
    // 1,000,000 empty nodes: one length comparison, no per-node validation or error report.
    (d as Record<string, unknown>).nodes = new Array(1_000_000).fill({});
    const r = safeAnalyzeSystem(d);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.code).toBe('document-too-large');
      expect(r.error.field).toBe('nodes');
      expect(r.error.message).toContain(`at most ${DOCUMENT_BOUNDS.nodes}`);
    }
    // One error for the list, not one per node (the cost is one length comparison; no timing asserted here).
    if (!r.ok) expect((r.error.issues ?? []).length).toBeLessThanOrEqual(1);
  });

  it('a document of many invalid elements within the bounds returns at most 100 issues, and says how many there were', () => {
    const d = clone(oneSegment()) as Doc;
    (d as Record<string, unknown>).segments = new Array(5000).fill({});
    const r = safeAnalyzeSystem(d);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error.issues!.length).toBeLessThanOrEqual(100);
      expect(r.error.message).toMatch(/problems in all; the first 100 are listed/);
    }
  });

  it('a label longer than 200 characters is refused by the schema', () => {
    const d = clone(oneSegment()) as Doc;
    d.nodes[1].label = 'x'.repeat(201);
    const r = safeAnalyzeSystem(d);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.field).toBe('label');
  });
});
