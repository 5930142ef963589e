import { useState } from 'react';
import { z } from 'zod';
import { CheckboxField, SelectField, TextAreaField, TextField } from '../../../components/ui/field';
import { Section } from '../../../components/ui/card';
import { FlowTestSchema, NodeSchema, SourceSchema, SystemDocumentSchema } from '../../../engine/model/schema';
import type { SystemDocument } from '../../../engine';
import { useWalk } from '../draft/walk-context';
import { StepIntro } from '../components/cells';
import { num } from '../../../shared/format/quantity';
import { numberInput, plainError } from '../lib/form-values';
import { useLiveForm } from '../lib/use-live-form';
import { FedFromSection } from '../components/fed-from-section';
import { SOURCE_KIND_LABELS } from '../../../engine/model/labels';
import { FLOW_TEST, NODE, SOURCE, SYSTEM_DOCUMENT } from '../../../engine/model/elements';
import { describedField } from '../lib/described';

const SOURCE_KINDS = (['utility-main', 'tank', 'booster-outlet'] as const).map((value) => ({ value, label: SOURCE_KIND_LABELS[value] }));

const optionalDate = z.preprocess((v) => (v === '' ? undefined : v), z.iso.date('Enter a date as YYYY-MM-DD').optional());

/** The supply step's fields, from the engine's source, flow-test and node schemas. */
export const supplyFormSchema = z
  .object({
    kind: SourceSchema.shape.kind,
    staticPressureLow: SourceSchema.shape.staticPressureLow,
    staticPressureHigh: SourceSchema.shape.staticPressureHigh,
    pressureBasis: z.string().trim().min(1, 'Say where the pressure figures came from'),
    pressureDate: optionalDate,
    connectionElevation: NodeSchema.shape.elevation,
    waterTemperature: SystemDocumentSchema.shape.waterTemperature,
    hasFlowTest: z.boolean(),
    flowTest: z.object({
      staticPressure: z.unknown().optional(),
      residualPressure: z.unknown().optional(),
      flow: z.unknown().optional(),
      date: z.unknown().optional(),
    }),
  })
  .superRefine((v, ctx) => {
    if (v.staticPressureHigh < v.staticPressureLow) {
      ctx.addIssue({ code: 'custom', path: ['staticPressureHigh'], message: 'The high static pressure cannot be below the low one' });
    }
    if (v.hasFlowTest) {
      const test = FlowTestSchema.extend({ date: optionalDate }).safeParse(v.flowTest);
      if (!test.success)
        for (const issue of test.error.issues)
          ctx.addIssue({ code: 'custom', path: ['flowTest', ...issue.path.map(String)], message: plainError(issue.message) ?? issue.message });
      else if (test.data.residualPressure > test.data.staticPressure) {
        ctx.addIssue({ code: 'custom', path: ['flowTest', 'residualPressure'], message: 'The residual pressure cannot be above the test’s static pressure' });
      }
    }
  });
type SupplyForm = z.input<typeof supplyFormSchema>;

function formValues(doc: SystemDocument): SupplyForm {
  const node = doc.nodes.find((n) => n.id === doc.source.nodeId);
  const test = doc.source.flowTest;
  return {
    kind: doc.source.kind,
    staticPressureLow: doc.source.staticPressureLow,
    staticPressureHigh: doc.source.staticPressureHigh,
    pressureBasis: doc.source.pressureBasis,
    pressureDate: doc.source.pressureDate ?? '',
    connectionElevation: node?.elevation ?? 0,
    waterTemperature: doc.waterTemperature,
    hasFlowTest: test !== undefined,
    flowTest: { staticPressure: test?.staticPressure, residualPressure: test?.residualPressure, flow: test?.flow, date: test?.date ?? '' },
  };
}

export function applySupply(doc: SystemDocument, v: z.output<typeof supplyFormSchema>): SystemDocument {
  const fedFrom = doc.source.fedFrom;
  if (fedFrom) {
    // Fed from a cold system: the pressures, their basis and date come from it (never typed here).
    return {
      ...doc,
      waterTemperature: v.waterTemperature,
      source: { ...doc.source, kind: v.kind },
      nodes: doc.nodes.map((n) => (n.id === doc.source.nodeId ? { ...n, elevation: v.connectionElevation } : n)),
    };
  }
  const test = v.hasFlowTest ? FlowTestSchema.extend({ date: optionalDate }).parse(v.flowTest) : undefined;
  const source: SystemDocument['source'] = {
    kind: v.kind,
    nodeId: doc.source.nodeId,
    staticPressureLow: v.staticPressureLow,
    staticPressureHigh: v.staticPressureHigh,
    pressureBasis: v.pressureBasis,
    ...(v.pressureDate ? { pressureDate: v.pressureDate } : {}),
    ...(test ? { flowTest: test.date ? test : { staticPressure: test.staticPressure, residualPressure: test.residualPressure, flow: test.flow } } : {}),
  };
  return {
    ...doc,
    waterTemperature: v.waterTemperature,
    source,
    nodes: doc.nodes.map((n) => (n.id === doc.source.nodeId ? { ...n, elevation: v.connectionElevation } : n)),
  };
}

export function SupplyStep() {
  const { document, draft, readOnlyReason, units, live } = useWalk();
  const [defaults] = useState(() => formValues(document));
  const form = useLiveForm(supplyFormSchema, defaults, (v) => draft.update((doc) => applySupply(doc, v)));
  const {
    register,
    formState: { errors },
  } = form;
  const hasFlowTest = form.watch('hasFlowTest');
  const e = (m?: string) => plainError(m);
  const source = live.ok ? live.analysis.source : null;
  const fed = document.source.fedFrom !== undefined;
  const sys = document.unitSystem;

  return (
    <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Supply">
      <StepIntro title="Supply">
        Where the water enters and at what pressure. Design on the <strong>lowest</strong> pressure the utility will deliver — the low static pressure in its
        letter, or a flow test taken in the season of lowest pressure — and check the maximum static pressure against the high figure.
      </StepIntro>
      <fieldset disabled={readOnlyReason !== null} className="flex flex-col gap-6">
        {document.service === 'hot' ? <FedFromSection /> : null}
        <Section title="Source" headingLevel={3}>
          <div className="grid gap-4 md:grid-cols-2">
            <SelectField {...describedField(SOURCE, 'kind', sys)} options={SOURCE_KINDS} error={e(errors.kind?.message)} {...register('kind')} />
            <TextField
              {...describedField(NODE, 'elevation', sys, { after: 'of the connection' })}
              type="text"
              inputMode="decimal"
              autoComplete="off"
              error={e(errors.connectionElevation?.message)}
              {...register('connectionElevation', numberInput)}
            />
            {fed ? (
              <p className="text-sm text-ink-soft md:col-span-2" data-testid="fed-pressures-note">
                The static pressures and their basis are read from the cold system (above), not typed: low{' '}
                {num(document.source.staticPressureLow, units.pressure)} {units.pressure}, high {num(document.source.staticPressureHigh, units.pressure)}{' '}
                {units.pressure}.
              </p>
            ) : (
              <>
                <TextField
                  {...describedField(SOURCE, 'staticPressureLow', sys)}
                  type="text"
                  inputMode="decimal"
                  autoComplete="off"
                  error={e(errors.staticPressureLow?.message)}
                  {...register('staticPressureLow', numberInput)}
                />
                <TextField
                  {...describedField(SOURCE, 'staticPressureHigh', sys)}
                  type="text"
                  inputMode="decimal"
                  autoComplete="off"
                  error={e(errors.staticPressureHigh?.message)}
                  {...register('staticPressureHigh', numberInput)}
                />
                <TextAreaField
                  className="md:col-span-2"
                  {...describedField(SOURCE, 'pressureBasis', sys)}
                  error={e(errors.pressureBasis?.message)}
                  {...register('pressureBasis')}
                />
              </>
            )}
            <TextField {...describedField(SOURCE, 'pressureDate', sys)} type="date" error={e(errors.pressureDate?.message)} {...register('pressureDate')} />
            <TextField
              {...describedField(SYSTEM_DOCUMENT, 'waterTemperature', sys)}
              type="text"
              inputMode="decimal"
              autoComplete="off"
              error={e(errors.waterTemperature?.message)}
              {...register('waterTemperature', numberInput)}
            />
          </div>
        </Section>
        <Section title="Flow test (optional)" headingLevel={3}>
          <CheckboxField label="A flow test was made at the connection" {...register('hasFlowTest')} />
          {hasFlowTest ? (
            <div className="mt-4 grid gap-4 md:grid-cols-2">
              <TextField
                {...describedField(FLOW_TEST, 'staticPressure', sys)}
                type="text"
                inputMode="decimal"
                autoComplete="off"
                error={e(errors.flowTest?.staticPressure?.message)}
                {...register('flowTest.staticPressure', numberInput)}
              />
              <TextField
                {...describedField(FLOW_TEST, 'residualPressure', sys)}
                type="text"
                inputMode="decimal"
                autoComplete="off"
                error={e(errors.flowTest?.residualPressure?.message)}
                {...register('flowTest.residualPressure', numberInput)}
              />
              <TextField
                {...describedField(FLOW_TEST, 'flow', sys)}
                type="text"
                inputMode="decimal"
                autoComplete="off"
                error={e(errors.flowTest?.flow?.message)}
                {...register('flowTest.flow', numberInput)}
              />
              <TextField {...describedField(FLOW_TEST, 'date', sys)} type="date" error={e(errors.flowTest?.date?.message)} {...register('flowTest.date')} />
            </div>
          ) : null}
          <div className="mt-4 rounded-md bg-paper-deep p-3 text-sm" data-testid="source-at-design-flow">
            {source ? (
              <p>
                Design flow at the source:{' '}
                <strong>
                  {num(source.designFlow, units.flow)} {units.flow}
                </strong>
                . Pressure at the design flow:{' '}
                <strong>
                  {num(source.pressureAtDesignFlow, units.pressure)} {units.pressure}
                </strong>{' '}
                ({source.pressureBasis === 'flow-test' ? 'from the flow test' : 'the low static pressure, no flow test'}).
              </p>
            ) : (
              <p>The pressure at the design flow appears once the system can be computed.</p>
            )}
          </div>
        </Section>
      </fieldset>
    </form>
  );
}
