import { useEffect, useRef, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { VerdictShape, verdictOf } from '../../systems/components/verdict-mark';
import { useWalk } from '../draft/walk-context';
import { layoutTree } from '../lib/diagram-layout';
import { nodeElevations } from '../../../engine';
import { fmt, signed } from '../lib/format';

const COLUMN_PX = 120;
const HEIGHT_PX = 620;
// room on the right for the last column's fixture labels
const MARGIN = { l: 70, r: 320, t: 40, b: 40 };
/** Zoom steps: ×1.25 per press, between a quarter and four times the drawn size (a readable range). */
const ZOOM_STEP = 1.25;
const ZOOM_MIN = 0.25;
const ZOOM_MAX = 4;

/** The riser diagram: drawn from the tree, labelled with size and flow per segment and margin per checked fixture. */
export function RiserDiagramPage() {
  const { document, live, units } = useWalk();
  const [zoom, setZoom] = useState(1);
  const box = useRef<HTMLDivElement>(null);
  const clamp = (z: number) => Math.min(ZOOM_MAX, Math.max(ZOOM_MIN, z));

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const onWheel = (ev: WheelEvent) => {
      if (!ev.ctrlKey && !ev.metaKey && !ev.altKey) return; // plain wheel scrolls the page as usual
      ev.preventDefault();
      setZoom((z) => clamp(ev.deltaY < 0 ? z * ZOOM_STEP : z / ZOOM_STEP));
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, []);

  const analysis = live.ok ? live.analysis : null;
  const segResult = new Map(analysis?.segments.map((s) => [s.id, s]) ?? []);
  const elevation = nodeElevations(document);
  const layout = layoutTree({
    sourceNodeId: document.source.nodeId,
    nodes: document.nodes.map((n) => ({ ...n, elevation: elevation.get(n.id) ?? 0 })),
    segments: document.segments.map((s) => ({ id: s.id, from: s.from, to: s.to, rise: (elevation.get(s.to) ?? 0) - (elevation.get(s.from) ?? 0) })),
  });
  const W = MARGIN.l + MARGIN.r + layout.columns * COLUMN_PX;
  const H = MARGIN.t + MARGIN.b + HEIGHT_PX;
  const range = layout.maxElevation - layout.minElevation || 1;
  const x = (id: string) => MARGIN.l + (layout.column.get(id) ?? 0) * COLUMN_PX;
  const y = (id: string) => MARGIN.t + (1 - ((elevation.get(id) ?? 0) - layout.minElevation) / range) * HEIGHT_PX;
  const fixtures = analysis?.fixtures ?? [];
  const passCount = fixtures.filter((f) => f.pass).length;

  return (
    <div className="flex flex-col gap-3">
      <style>{'@media print { header, footer, nav, .print-hide { display: none !important; } main { max-width: none !important; padding: 0 !important; } }'}</style>
      <h2 className="text-2xl">Riser diagram</h2>
      <div className="print-hide flex flex-wrap items-center gap-2" role="group" aria-label="Zoom and print">
        <Button variant="secondary" onClick={() => setZoom((z) => clamp(z / ZOOM_STEP))} aria-label="Zoom out">−</Button>
        <span className="min-w-16 text-center text-sm tabular-nums" aria-live="polite">{Math.round(zoom * 100)} %</span>
        <Button variant="secondary" onClick={() => setZoom((z) => clamp(z * ZOOM_STEP))} aria-label="Zoom in">+</Button>
        <Button variant="secondary" onClick={() => setZoom(1)}>Actual size</Button>
        <Button variant="secondary" onClick={() => window.print()}>Print</Button>
        <span className="text-sm text-ink-soft">Ctrl + wheel over the diagram zooms too.</span>
      </div>
      {!analysis ? <p className="text-fault">Not computed: {live.ok ? '' : live.message}. Sizes are drawn; flows and margins appear once the system computes.</p> : null}
      <div ref={box} className="max-h-[80vh] overflow-auto rounded-md border-2 border-rule bg-surface print:max-h-none print:overflow-visible" tabIndex={0} aria-label="Riser diagram, scrollable">
        <svg width={W * zoom} height={H * zoom} viewBox={`0 0 ${W} ${H}`} role="img" aria-labelledby="riser-title riser-desc" data-testid="riser-diagram">
          <title id="riser-title">Riser diagram of {document.name}</title>
          <desc id="riser-desc">
            {document.segments.length} segments from the source; {fixtures.length} checked fixtures, {passCount} pass and {fixtures.length - passCount} fail. Height follows node elevation.
          </desc>
          {document.segments.map((s) => {
            const r = segResult.get(s.id);
            const x1 = x(s.from), y1 = y(s.from), x2 = x(s.to), y2 = y(s.to);
            const failing = r?.velocityPass === false;
            const label = `${s.size ?? 'custom'}${units.diameter === 'in' ? '″' : ''}${r ? ` · ${fmt(r.designFlow, 1)} ${units.flow}` : ''}`;
            const lx = x2 + 4;
            const ly = (y1 + y2) / 2;
            return (
              <g key={s.id}>
                <path d={`M${x1},${y1} H${x2} V${y2}`} fill="none" stroke={failing ? '#9b1c1c' : '#123f4a'} strokeWidth={failing ? 4 : 2.5} strokeDasharray={failing ? '6 3' : undefined} />
                <text x={x1 === x2 ? lx : (x1 + x2) / 2} y={x1 === x2 ? ly : y1 - 4} fontSize="10" fill="#17222a" textAnchor={x1 === x2 ? 'start' : 'middle'}>
                  {label}
                  {failing ? ' ▲ fast' : ''}
                </text>
              </g>
            );
          })}
          {document.nodes.map((n) => (
            <circle key={n.id} cx={x(n.id)} cy={y(n.id)} r={n.id === document.source.nodeId ? 6 : 3} fill={n.id === document.source.nodeId ? '#a4501c' : '#123f4a'} />
          ))}
          <text x={x(document.source.nodeId) + 8} y={y(document.source.nodeId) + 14} fontSize="11" fontWeight="600" fill="#a4501c">Source</text>
          {fixtures.map((f, k) => {
            const same = fixtures.filter((g, j) => g.nodeId === f.nodeId && j < k).length;
            const fx = x(f.nodeId) + 8;
            const fy = y(f.nodeId) - 8 - same * 16;
            const verdict = verdictOf(f.pass);
            return (
              <g key={f.id} transform={`translate(${fx},${fy - 10})`} data-testid={`diagram-fixture-${f.id}`}>
                <g transform="scale(0.8)"><VerdictShapeInSvg pass={f.pass} /></g>
                <text x={16} y={11} fontSize="10" fill={f.pass ? '#22613f' : '#9b1c1c'} fontWeight={analysis?.criticalFixtureId === f.id ? 700 : 400}>
                  {f.label}: {signed(f.margin, 1)} {units.pressure} {verdict === 'pass' ? 'pass' : 'FAIL'}
                  {analysis?.criticalFixtureId === f.id ? ' (critical)' : ''}
                </text>
              </g>
            );
          })}
        </svg>
      </div>
      <p className="text-sm text-ink-soft">
        <VerdictShape verdict="pass" /> pass · <VerdictShape verdict="fail" /> fail · dashed thick pipe: velocity over the limit. Labels: nominal size · design flow.
      </p>
    </div>
  );
}

/** The pass/fail shapes drawn inside the diagram's own SVG (same shapes as the page's marks). */
function VerdictShapeInSvg({ pass }: { pass: boolean }) {
  return pass ? (
    <g>
      <circle cx="8" cy="8" r="7" fill="#22613f" />
      <path d="M4.5 8.3 7 10.8 11.6 5.6" fill="none" stroke="white" strokeWidth="2" />
    </g>
  ) : (
    <g>
      <path d="M8 1 15.5 14.5H.5Z" fill="#9b1c1c" />
      <path d="M8 5.5v4.5M8 12v.6" stroke="white" strokeWidth="2" />
    </g>
  );
}
