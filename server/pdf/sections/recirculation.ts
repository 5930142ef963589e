/**
 * "Hot-water recirculation": for a hot system whose document describes a loop, what the engine
 * computed from it (src/engine/hotWater/recirculationDocument.ts, stored with the analysis): the
 * loop's heat loss and allowed drop, the loop (pump) flow, the pump head, each pipe's size — chosen
 * for the return, given otherwise — with its velocity against its limit, and the sources. This file
 * only prints them.
 */
import { MATERIALS } from '../../../src/engine/catalog/materials';
import type { Analysis, SystemDocument } from '../../../src/engine';
import { COLORS, type Layout } from '../layout';
import { num, withUnit } from '../../../src/shared/format/quantity';

export function recirculationSection(c: { L: Layout; a: Analysis; doc: SystemDocument }) {
  const { L, a, doc } = c;
  const r = a.recirculation;
  if (!r || !doc.recirculation) return;
  L.heading('Hot-water recirculation', 2, 120);
  if (!r.ok) {
    L.paragraph(`The recirculation loop could not be computed: ${r.error.field ? `${r.error.field}: ` : ''}${r.error.message}`, {
      size: 8.5,
      color: COLORS.fail,
    });
    return;
  }
  const u = r.units;
  const dropUnit = u.heat === 'W' ? 'K' : '°F';
  const drop = withUnit(r.temperatureDrop, dropUnit);
  L.keyValues([
    ['Loop heat loss', `${withUnit(r.heatLoss, u.heat)}, at ${withUnit(r.hotTemperature, u.temperature)} leaving the heater, drop allowed ${drop}`],
    ['Loop flow = pump flow', withUnit(r.pumpFlow, u.flow, 'loop flow')],
    [
      'Pump head',
      `${withUnit(r.pumpHead, u.pressure)} (${withUnit(r.pumpHeadLength, u.length)} of water): pipe friction × ${(1 + r.fittingAllowance).toFixed(2)} + heater loss ${withUnit(r.heaterLoss, u.pressure)}`,
    ],
  ]);
  const unverified = r.pipes.filter((p) => Object.hasOwn(MATERIALS, p.material) && !MATERIALS[p.material as keyof typeof MATERIALS].verified);
  L.table(
    [
      { header: 'Pipe (from → to)', width: 26, wrap: true },
      { header: 'Material, size', width: 24, wrap: true },
      { header: `Velocity / limit (${u.velocity})`, width: 16, align: 'right' },
      { header: `Friction (${u.pressure})`, width: 12, align: 'right' },
      { header: `Heat loss (${u.heat})`, width: 12, align: 'right' },
      { header: 'Limits', width: 10 },
    ],
    r.pipes.map((p) => {
      const material = Object.hasOwn(MATERIALS, p.material) ? MATERIALS[p.material as keyof typeof MATERIALS] : undefined;
      return {
        cells: [
          `${p.label} (${p.from} → ${p.to})`,
          `${material?.label ?? p.material}${material && !material.verified ? ' (unverified)' : ''}, ${p.size} ${p.sizeChosen ? '(chosen, return)' : '(given)'}`,
          `${num(p.velocity, u.velocity)} / ${num(p.velocityLimit, u.velocity)}`,
          num(p.frictionLoss, u.pressure),
          num(p.heatLoss, u.heat),
          p.withinLimits ? 'within' : 'over',
        ],
        style: p.withinLimits ? undefined : { fail: true },
      };
    }),
    { continued: 'Hot-water recirculation' },
  );
  L.paragraph(`Sources: ${r.sources.join('; ')}.`, { size: 7.5, color: COLORS.muted });
  L.paragraph(
    `The return's friction limit and the fitting allowance are designers' rules of thumb, not code limits; the adopted code, the AHJ and the pump maker's data govern the pump chosen.${unverified.length ? ' A material marked unverified has data not checked against a printed source: confirm it.' : ''}`,
    { size: 7.5, color: COLORS.muted },
  );
}
