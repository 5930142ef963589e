/**
 * The pressure profile along the critical fixture's path, drawn as vector lines: residual
 * pressure against developed length from the source, each device as a vertical step with a
 * numbered marker keyed under the chart to its name and change, the fixture's minimum flow pressure as a dashed line, and both axes ticked
 * at round values (whole multiples of a 1-2-5 step).
 */
import type { Analysis } from '../../src/engine';
import { COLORS, type Layout } from './layout';
import { axisTickLabel, signed, withUnit } from '../../src/shared/format/quantity';

export interface ProfilePoint {
  x: number;
  pressure: number;
  /** set on the point after a device's step: its name and pressure change (negative = loss) */
  device?: { label: string; change: number };
}

/** Points along the path: the source, then each segment's inlet, after each of its devices, and outlet. */
export function profilePoints(analysis: Analysis, fixtureId: string): ProfilePoint[] {
  const fx = analysis.fixtures.find((f) => f.id === fixtureId);
  if (!fx) return [];
  const byId = new Map(analysis.segments.map((s) => [s.id, s]));
  const points: ProfilePoint[] = [{ x: 0, pressure: analysis.source.pressureAtDesignFlow }];
  let x = 0;
  for (const id of fx.path) {
    const s = byId.get(id);
    if (!s) continue;
    // inletPressure is ahead of the segment's devices: each device shows as a vertical step, in the ledger's order
    points.push({ x, pressure: s.inletPressure });
    let p = s.inletPressure;
    for (const d of s.devices) {
      p -= d.loss;
      points.push({ x, pressure: p, device: { label: d.label, change: -d.loss } });
    }
    x += s.length;
    points.push({ x, pressure: s.outletPressure });
  }
  return points;
}

/** Round axis steps: 1, 2 or 5 × 10^n, about `target` intervals over `span` (common practice for chart axes). */
export function niceStep(span: number, target: number): number {
  const raw = span / Math.max(target, 1);
  const mag = 10 ** Math.floor(Math.log10(raw || 1));
  for (const m of [1, 2, 5, 10]) if (raw <= m * mag) return m * mag;
  return 10 * mag;
}

/**
 * The ticks of an axis covering `min` to `max`: whole multiples of a 1-2-5 step, each computed as
 * k × step (never by adding steps up, which drifts), with its label.
 */
export function axisTicks(min: number, max: number, target: number): { step: number; ticks: { value: number; label: string }[] } {
  const step = niceStep(max - min, target);
  const first = Math.floor(min / step + 1e-9);
  const last = Math.max(Math.ceil(max / step - 1e-9), first + 1);
  const ticks: { value: number; label: string }[] = [];
  for (let k = first; k <= last; k++) ticks.push({ value: k * step, label: axisTickLabel(k * step, step) });
  return { step, ticks };
}

/** The profile's axes and device labels as the PDF prints them (pure: the golden text lists them). */
export function profileAxes(points: ProfilePoint[], required: number, pressureUnit: string) {
  const xMax = Math.max(...points.map((p) => p.x), 1);
  const pMax = Math.max(...points.map((p) => p.pressure), required);
  const pMin = Math.min(0, ...points.map((p) => p.pressure));
  return {
    y: axisTicks(pMin, pMax, 5),
    x: axisTicks(0, xMax, 6),
    devices: points
      .filter((p) => p.device)
      .map((p) => ({ x: p.x, pressure: p.pressure, text: `${p.device!.label} ${signed(p.device!.change, pressureUnit)} ${pressureUnit}` })),
  };
}

export function drawProfile(
  layout: Layout,
  points: ProfilePoint[],
  opts: { required: number; pressureUnit: string; lengthUnit: string; fixtureLabel: string },
) {
  const height = 190;
  const keyLines = points.filter((p) => p.device).length;
  layout.ensure(height + 30 + keyLines * 10.2);
  const page = layout.page;
  const { regular } = layout.fonts;
  const size = 7;
  const box = { x: layout.left + 40, y: layout.y - height, w: layout.contentWidth - 50, h: height - 40 };
  box.y += 22; // room for the x-axis labels

  const axes = profileAxes(points, opts.required, opts.pressureUnit);
  const pointsWithDevices = points.filter((p) => p.device);
  // the pressure just before each device's step (the point drawn before it)
  const stepTops = pointsWithDevices.map((p) => points[points.indexOf(p) - 1].pressure);
  const yBottom = axes.y.ticks[0].value;
  const yTop = axes.y.ticks[axes.y.ticks.length - 1].value;
  const xRight = axes.x.ticks[axes.x.ticks.length - 1].value;
  const X = (x: number) => box.x + (x / xRight) * box.w;
  const Y = (p: number) => box.y + ((p - yBottom) / (yTop - yBottom)) * box.h;

  const label = (text: string, x: number, y: number, align: 'left' | 'right' | 'center') => {
    const t = layout.clean(text);
    const w = layout.measure(t, regular, size);
    const at = align === 'right' ? x - w : align === 'center' ? x - w / 2 : x;
    page.drawText(t, { x: Math.max(layout.left, Math.min(at, layout.right - w)), y, size, font: regular, color: COLORS.muted });
  };

  for (const t of axes.y.ticks) {
    page.drawLine({ start: { x: box.x, y: Y(t.value) }, end: { x: box.x + box.w, y: Y(t.value) }, thickness: 0.3, color: COLORS.rule });
    label(t.label, box.x - 4, Y(t.value) - 2.5, 'right');
  }
  for (const t of axes.x.ticks) {
    page.drawLine({ start: { x: X(t.value), y: box.y }, end: { x: X(t.value), y: box.y - 3 }, thickness: 0.5, color: COLORS.muted });
    label(t.label, X(t.value), box.y - 11, 'center');
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

  // each device's step carries a numbered marker beside its middle; the key under the chart names
  // the device and its change (labels on the plot would cross the line where steps are close)
  axes.devices.forEach((d, k) => {
    const before = stepTops[k];
    const mid = (Y(before) + Y(d.pressure)) / 2;
    const cx = X(d.x) - 7;
    page.drawCircle({ x: cx, y: mid, size: 4.6, color: COLORS.band, borderColor: COLORS.accent, borderWidth: 0.6 });
    const n = String(k + 1);
    page.drawText(n, { x: cx - layout.measure(n, regular, 6) / 2, y: mid - 2.1, size: 6, font: regular, color: COLORS.accent });
  });

  const last = points[points.length - 1];
  page.drawCircle({ x: X(last.x), y: Y(last.pressure), size: 2.6, color: COLORS.accent });
  layout.y -= height + 2;
  // the key of the device steps
  axes.devices.forEach((d, k) => layout.paragraph(`${k + 1}  ${d.text}`, { size: 7.5, indent: 40, after: 0 }));
  layout.y -= 8;
}
