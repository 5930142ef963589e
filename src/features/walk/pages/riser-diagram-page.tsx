import { useEffect, useMemo, useRef, useState } from 'react';
import { Button } from '../../../components/ui/button';
import {
  fixtureVerdict,
  VERDICT_COLOUR,
  VERDICT_WORDS,
  VerdictGlyph,
  VerdictMark,
  VerdictShape,
  verdictOfStatus,
  type Verdict,
} from '../../systems/components/verdict-mark';
import { liveStatus, plural } from '../lib/verdict';
import { useWalk } from '../draft/walk-context';
import { num, signed } from '../../../shared/format/quantity';
import { fitText, screenDrawing, svgY } from '../lib/riser-screen';
import { DEVICE_TAG_WORDS, textWidth, type DeviceTag, type DrawItem } from '../../../shared/diagram/riserLayout';

/** Zoom steps: ×1.25 per press, between a quarter and four times the printed size (a readable range). */
const ZOOM_STEP = 1.25;
const ZOOM_MIN = 0.25;
const ZOOM_MAX = 4;
/** 100 % is the printed sheet's size: one point is 4/3 CSS px (CSS: 96 px an inch, 72 pt an inch). */
const PX_PER_PT = 4 / 3;
/** The fixtures' margin labels, in points: a little smaller than the pipe labels' 4.6 pt. */
const FIXTURE_LABEL_SIZE = 4.2;

const INK = '#17222a';
const ACCENT = '#123f4a';
const RULE = '#9aa5ad';
const MATCH = '#9b1c1c';

/** A pale outline under every text, so a name that crosses a pipe or another label stays legible. */
const HALO = { stroke: '#fbfaf7', strokeWidth: 1.2, strokeLinejoin: 'round', paintOrder: 'stroke' } as const;

/** A zoom step from the current zoom; from "fit" it steps from the printed size. */
const zoomedBy = (z: number | 'fit', factor: number) => Math.min(ZOOM_MAX, Math.max(ZOOM_MIN, (z === 'fit' ? 1 : z) * factor));

const verdictText = (v: Verdict) => (v === 'pass' ? 'pass' : v === 'fail' ? 'FAIL' : 'incomplete');

/**
 * The riser diagram: the summary's own layout (floors, risers, sizes and materials, tagged
 * devices) drawn as SVG, fitted to the page's width by default or at a chosen zoom, with every
 * checked fixture's margin written beside it; printed on one sheet.
 */
export function RiserDiagramPage() {
  const { document, live, units } = useWalk();
  const [zoom, setZoom] = useState<number | 'fit'>('fit');
  const box = useRef<HTMLDivElement>(null);
  const stepBy = (factor: number) => setZoom((z) => zoomedBy(z, factor));

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const onWheel = (ev: WheelEvent) => {
      if (!ev.ctrlKey && !ev.metaKey && !ev.altKey) return; // plain wheel scrolls the page as usual
      ev.preventDefault();
      const factor = ev.deltaY < 0 ? ZOOM_STEP : 1 / ZOOM_STEP;
      setZoom((z) => zoomedBy(z, factor));
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, []);

  const analysis = live.ok ? live.analysis : null;
  const status = liveStatus(live);
  const drawing = useMemo(() => (analysis ? screenDrawing(document, analysis) : null), [document, analysis]);
  const fixtures = analysis?.fixtures ?? [];
  const passCount = fixtures.filter((f) => f.pass).length;

  if (!analysis || !drawing) {
    return (
      <div className="flex flex-col gap-3">
        <h2 className="text-2xl">Riser diagram</h2>
        <p className="text-fault">
          Not computed: {live.ok ? '' : live.message}. The diagram is drawn once the system computes: fix the input named here in the walk.
        </p>
      </div>
    );
  }

  const { diagram, area, items } = drawing;
  const byId = new Map(fixtures.map((f) => [f.id, f]));
  const tags = [...new Set(diagram.devices.map((d) => d.tag))] as DeviceTag[];
  const fit = zoom === 'fit';
  // the view starts above the sheet where a fixture's label rises past its top (the roof's fixtures)
  const top = Math.min(
    0,
    ...items.flatMap((item) => {
      if (item.type !== 'box' || !item.fixtureId) return [];
      const f = byId.get(item.fixtureId);
      if (!f) return [];
      const label = fixtureLabel(item, f.margin, units.pressure, fixtureVerdict(f.pass, status), analysis.criticalFixtureId === f.id, area.height);
      return [label.y - textWidth(label.shown, FIXTURE_LABEL_SIZE) - 2];
    }),
  );
  const viewHeight = area.height - top;
  const floors = [...new Set(diagram.fixtures.map((f) => f.floor))];

  return (
    <div className="riser-page flex flex-col gap-3">
      <style>{`@media print {
  @page { margin: 12mm; }
  header, footer, nav, .print-hide { display: none !important; }
  main { max-width: none !important; padding: 0 !important; }
  .riser-page svg[data-testid="riser-diagram"] { width: 100% !important; height: auto !important; max-height: 200mm; break-inside: avoid; }
  .riser-key { break-before: page; }
}`}</style>
      <div className="flex flex-wrap items-center gap-3">
        <h2 className="text-2xl">Riser diagram</h2>
        <VerdictMark verdict={verdictOfStatus(status)} />
      </div>
      <div className="print-hide flex flex-wrap items-center gap-2" role="group" aria-label="Zoom and print">
        <Button variant={fit ? 'primary' : 'secondary'} onClick={() => setZoom('fit')} aria-pressed={fit}>
          Fit to width
        </Button>
        <Button variant="secondary" onClick={() => stepBy(1 / ZOOM_STEP)} aria-label="Zoom out">
          −
        </Button>
        <span className="min-w-16 text-center text-sm tabular-nums" aria-live="polite" data-testid="riser-zoom">
          {fit ? 'fitted' : `${Math.round(zoom * 100)} %`}
        </span>
        <Button variant="secondary" onClick={() => stepBy(ZOOM_STEP)} aria-label="Zoom in">
          +
        </Button>
        <Button variant="secondary" onClick={() => setZoom(1)}>
          Printed size
        </Button>
        <Button variant="secondary" onClick={() => window.print()}>
          Print
        </Button>
        <span className="text-sm text-ink-soft">Ctrl + wheel over the diagram zooms too.</span>
      </div>
      <div
        ref={box}
        className={`rounded-md border-2 border-rule bg-surface print:max-h-none print:overflow-visible print:border-0 ${fit ? '' : 'max-h-[80vh] overflow-auto'}`}
        tabIndex={0}
        aria-label="Riser diagram, scrollable"
        data-testid="riser-diagram-box"
      >
        <svg
          width={fit ? '100%' : area.width * PX_PER_PT * zoom}
          height={fit ? undefined : viewHeight * PX_PER_PT * zoom}
          viewBox={`${area.left} ${top} ${area.width} ${viewHeight}`}
          preserveAspectRatio="xMinYMin meet"
          className="block"
          style={{ fontFamily: 'inherit' }}
          role="img"
          aria-labelledby="riser-title riser-desc"
          data-testid="riser-diagram"
          data-fit={fit ? 'width' : 'zoom'}
        >
          <title id="riser-title">Riser diagram of {document.name}</title>
          <desc id="riser-desc">
            {plural(diagram.pipes.length, 'segment')} from the source, heights to scale; {plural(diagram.levels.length, 'level')};{' '}
            {plural(diagram.devices.length, 'device')}; {plural(fixtures.length, 'checked fixture')}, {passCount} pass and {fixtures.length - passCount} fail;
            the verdict is {VERDICT_WORDS[verdictOfStatus(status)].toLowerCase()}.
          </desc>
          {items.map((item, k) => (
            <DrawnItem key={k} item={item} areaHeight={area.height} />
          ))}
          {items.flatMap((item) => {
            if (item.type !== 'box' || !item.fixtureId) return [];
            const f = byId.get(item.fixtureId);
            if (!f) return [];
            const verdict = fixtureVerdict(f.pass, status);
            const critical = analysis.criticalFixtureId === f.id;
            const full = `${f.label}: ${signed(f.margin, units.pressure)} ${units.pressure} ${verdictText(verdict)}${critical ? ' (critical)' : ''}`;
            const { x, y, shown } = fixtureLabel(item, f.margin, units.pressure, verdict, critical, area.height);
            return [
              <g key={`f-${f.id}`} data-testid={`diagram-fixture-${f.id}`} data-verdict={verdict} color={VERDICT_COLOUR[verdict]}>
                <title>{full}</title>
                <g
                  transform={`translate(${item.x + item.width / 2 - 3},${svgY(area, item.y + item.height / 2) - 3}) scale(${GLYPH_SCALE})`}
                  data-shape={verdict}
                >
                  <VerdictGlyph verdict={verdict} />
                </g>
                <text
                  transform={`translate(${x},${y}) rotate(-90)`}
                  fontSize={FIXTURE_LABEL_SIZE}
                  fill="currentColor"
                  fontWeight={critical ? 700 : 400}
                  {...HALO}
                >
                  {shown}
                </text>
              </g>,
            ];
          })}
        </svg>
      </div>
      <p className="text-sm text-ink-soft">
        Schematic, heights to scale (each node at its elevation, {diagram.lengthUnit}); branches spread sideways. Pipes are labelled with nominal size and
        material; risers are drawn heavier. Devices: {tags.length ? tags.map((t) => `${t} ${DEVICE_TAG_WORDS[t]}`).join(', ') : 'none'}. Beside each checked
        fixture, its margin ({units.pressure}) and verdict: <VerdictShape verdict="pass" /> pass · <VerdictShape verdict="fail" /> FAIL ·{' '}
        <VerdictShape verdict="incomplete" /> incomplete (the description is not complete yet).
      </p>
      <section className="riser-key flex flex-col gap-2" aria-label="Levels, devices and checked fixtures" data-testid="riser-key">
        <h3 className="text-lg">Levels, devices and checked fixtures</h3>
        <p className="text-sm" data-testid="riser-levels">
          <span className="font-semibold">Levels:</span>{' '}
          {diagram.levels.map((l) => `${l.name} (el. ${num(l.elevation, diagram.lengthUnit)} ${diagram.lengthUnit})`).join('; ')}.
        </p>
        <ul className="text-sm" data-testid="riser-devices">
          {diagram.devices.map((d) => (
            <li key={`${d.deviceId}-${d.at.x}-${d.at.y}`}>
              <span className="font-semibold">{d.tag}</span> {d.label} — {d.floor}
            </li>
          ))}
        </ul>
        {diagram.zones.length > 0 ? (
          <p className="text-sm" data-testid="riser-zones">
            <span className="font-semibold">Zone boundaries</span> (a dash-dot bar across the pipe, below the device, marked “Zone N starts”):{' '}
            {diagram.zones.map((z) => `${z.name} on ${z.floor}`).join('; ')}.
          </p>
        ) : null}
        {floors.map((floor) => (
          <div key={floor} className="text-sm">
            <p className="font-semibold">{floor}</p>
            <ul className="columns-1 md:columns-2 print:columns-2">
              {diagram.fixtures
                .filter((f) => f.floor === floor)
                .map((df) => {
                  const f = byId.get(df.fixtureId);
                  if (!f) return null;
                  const verdict = fixtureVerdict(f.pass, status);
                  return (
                    <li key={f.id} className="break-inside-avoid" data-testid={`key-fixture-${f.id}`}>
                      <VerdictShape verdict={verdict} size={12} /> {f.label}: {signed(f.margin, units.pressure)} {units.pressure} {verdictText(verdict)}
                      {analysis.criticalFixtureId === f.id ? ' (critical)' : ''}
                      <span className="text-ink-soft">
                        {' '}
                        · residual {num(f.residual, units.pressure)} {units.pressure}
                      </span>
                    </li>
                  );
                })}
            </ul>
          </div>
        ))}
      </section>
    </div>
  );
}

/** The verdict's shape at a fixture: the 16-unit glyph scaled to 6 pt. */
const GLYPH_SCALE = 6 / 16;

/**
 * A checked fixture's margin and verdict, upward from its marker (reading bottom to top, as the
 * pipe labels do) on the right of its drop: the drop's own size label sits on the left (its
 * ascent is 0.8 em, the layout's bound), and the next column is at least 11 pt away.
 */
function fixtureLabel(
  marker: { x: number; y: number; width: number; height: number },
  margin: number,
  pressureUnit: string,
  verdict: Verdict,
  critical: boolean,
  areaHeight: number,
) {
  const x = marker.x + marker.width / 2 + 1 + FIXTURE_LABEL_SIZE * 0.8;
  // above the verdict's shape (6 pt across, centred on the marker)
  const y = areaHeight - (marker.y + marker.height / 2) - 4;
  return { x, y, shown: `${signed(margin, pressureUnit)} ${verdictText(verdict)}${critical ? ' critical' : ''}` };
}

function DrawnItem({ item, areaHeight }: { item: DrawItem; areaHeight: number }) {
  const Y = (y: number) => areaHeight - y;
  if (item.type === 'line') {
    const style = {
      pipe: { strokeWidth: 0.7, stroke: INK },
      riser: { strokeWidth: 1.5, stroke: ACCENT },
      level: { strokeWidth: 0.35, stroke: RULE, strokeDasharray: '3 2' },
      match: { strokeWidth: 0.9, stroke: MATCH, strokeDasharray: '6 2 1 2' },
      zone: { strokeWidth: 1.4, stroke: INK, strokeDasharray: '3 1 1 1' },
    }[item.weight];
    return <line x1={item.x1} y1={Y(item.y1)} x2={item.x2} y2={Y(item.y2)} {...style} data-kind={item.weight} />;
  }
  if (item.type === 'box') {
    if (item.fixtureId) return null; // a checked fixture is drawn with its verdict's shape instead
    return <rect x={item.x} y={Y(item.y + item.height)} width={item.width} height={item.height} fill="#eef3f4" stroke={ACCENT} strokeWidth={0.6} />;
  }
  const text = fitText(item.text, item.size, item.maxWidth);
  if (!text) return null;
  const drawn = (
    <text
      transform={item.vertical ? `translate(${item.x},${Y(item.y)}) rotate(-90)` : undefined}
      x={item.vertical ? undefined : item.x}
      y={item.vertical ? undefined : Y(item.y)}
      fontSize={item.size}
      fontWeight={item.bold ? 600 : 400}
      fill={INK}
      {...HALO}
    >
      {text}
    </text>
  );
  // a shortened text keeps its whole wording as the tooltip (and in the key below the diagram)
  return text === item.text ? (
    drawn
  ) : (
    <g>
      <title>{item.text}</title>
      {drawn}
    </g>
  );
}
