/**
 * The pressure profile along the critical fixture's path, drawn as vector lines: residual
 * pressure against developed length from the source, each device as a vertical drop, and the
 * fixture's minimum flow pressure as a dashed line.
 */
import type { Analysis } from '../../src/engine';
import { COLORS, type Layout } from './layout';
import { withUnit } from './format';

export interface ProfilePoint {
  x: number;
  pressure: number;
}

/** Points along the path: the source, then each segment's inlet, after its devices, and outlet. */
export function profilePoints(analysis: Analysis, fixtureId: string): ProfilePoint[] {
  const fx = analysis.fixtures.find((f) => f.id === fixtureId);
  if (!fx) return [];
  const byId = new Map(analysis.segments.map((s) => [s.id, s]));
  const points: ProfilePoint[] = [{ x: 0, pressure: analysis.source.pressureAtDesignFlow }];
  let x = 0;
  for (const id of fx.path) {
    const s = byId.get(id);
    if (!s) continue;
    // inletPressure is ahead of the segment's devices: a device shows as a vertical step
    points.push({ x, pressure: s.inletPressure });
    if (s.deviceLoss !== 0) points.push({ x, pressure: s.inletPressure - s.deviceLoss });
    x += s.length;
    points.push({ x, pressure: s.outletPressure });
  }
  return points;
}

/** Round axis steps: 1, 2 or 5 × 10^n, about `target` intervals over `span`. */
function niceStep(span: number, target: number): number {
  const raw = span / Math.max(target, 1);
  const mag = 10 ** Math.floor(Math.log10(raw || 1));
  for (const m of [1, 2, 5, 10]) if (raw <= m * mag) return m * mag;
  return 10 * mag;
}

export function drawProfile(
  layout: Layout,
  points: ProfilePoint[],
  opts: { required: number; pressureUnit: string; lengthUnit: string; fixtureLabel: string },
) {
  const height = 190;
  layout.ensure(height + 30);
  const page = layout.page;
  const { regular } = layout.fonts;
  const size = 7;
  const box = { x: layout.left + 40, y: layout.y - height, w: layout.contentWidth - 50, h: height - 40 };
  box.y += 22; // room for the x-axis labels

  const xMax = Math.max(...points.map((p) => p.x), 1);
  const pMax = Math.max(...points.map((p) => p.pressure), opts.required);
  const pMin = Math.min(0, ...points.map((p) => p.pressure));
  const yStep = niceStep(pMax - pMin, 5);
  const yTop = Math.ceil(pMax / yStep) * yStep;
  const yBottom = Math.floor(pMin / yStep) * yStep;
  const xStep = niceStep(xMax, 6);
  const xRight = Math.ceil(xMax / xStep) * xStep;
  const X = (x: number) => box.x + (x / xRight) * box.w;
  const Y = (p: number) => box.y + ((p - yBottom) / (yTop - yBottom)) * box.h;

  const label = (text: string, x: number, y: number, align: 'left' | 'right' | 'center') => {
    const t = layout.clean(text);
    const w = layout.measure(t, regular, size);
    const at = align === 'right' ? x - w : align === 'center' ? x - w / 2 : x;
    page.drawText(t, { x: Math.max(layout.left, Math.min(at, layout.right - w)), y, size, font: regular, color: COLORS.muted });
  };

  for (let p = yBottom; p <= yTop + yStep / 2; p += yStep) {
    page.drawLine({ start: { x: box.x, y: Y(p) }, end: { x: box.x + box.w, y: Y(p) }, thickness: 0.3, color: COLORS.rule });
    label(fmtTick(p, yStep), box.x - 4, Y(p) - 2.5, 'right');
  }
  for (let x = 0; x <= xRight + xStep / 2; x += xStep) {
    page.drawLine({ start: { x: X(x), y: box.y }, end: { x: X(x), y: box.y - 3 }, thickness: 0.5, color: COLORS.muted });
    label(fmtTick(x, xStep), X(x), box.y - 11, 'center');
  }
  page.drawLine({ start: { x: box.x, y: box.y }, end: { x: box.x + box.w, y: box.y }, thickness: 0.7, color: COLORS.muted });
  page.drawLine({ start: { x: box.x, y: box.y }, end: { x: box.x, y: box.y + box.h }, thickness: 0.7, color: COLORS.muted });
  label(`Developed length from the source (${opts.lengthUnit})`, box.x + box.w / 2, box.y - 21, 'center');
  label(`Pressure (${opts.pressureUnit})`, layout.left, box.y + box.h + 10, 'left');

  // the minimum flow pressure of the fixture
  page.drawLine({
    start: { x: box.x, y: Y(opts.required) },
    end: { x: box.x + box.w, y: Y(opts.required) },
    thickness: 0.9,
    color: COLORS.fail,
    dashArray: [4, 3],
  });
  label(`minimum flow pressure at ${opts.fixtureLabel}: ${withUnit(opts.required, opts.pressureUnit)}`, box.x + 4, Y(opts.required) - 9, 'left');

  for (let i = 1; i < points.length; i++) {
    page.drawLine({
      start: { x: X(points[i - 1].x), y: Y(points[i - 1].pressure) },
      end: { x: X(points[i].x), y: Y(points[i].pressure) },
      thickness: 1.4,
      color: COLORS.accent,
    });
  }
  const last = points[points.length - 1];
  page.drawCircle({ x: X(last.x), y: Y(last.pressure), size: 2.6, color: COLORS.accent });
  layout.y -= height + 8;
}

function fmtTick(v: number, step: number): string {
  const decimals = step >= 1 ? 0 : Math.min(3, Math.ceil(-Math.log10(step)));
  return v.toFixed(decimals);
}
