import { Section } from '../../../components/ui/card';
import { TextField } from '../../../components/ui/field';
import { Button } from '../../../components/ui/button';
import { closedSystemCheck, closingElementWords, sizeDocumentExpansionTank } from '../../../engine';
import type { SystemDocument } from '../../../engine';
import { useWalk } from '../draft/walk-context';
import { describedField } from '../lib/described';
import { EXPANSION_TANK } from '../../../engine/model/elements';
import { num } from '../../../shared/format/quantity';

type Tank = NonNullable<SystemDocument['expansionTank']>;

/** A starting point for the inputs, to be replaced by the project's figures: 40/140 °F or 4/60 °C water (common practice design temperatures), the source's low static as precharge, 150 psi (1034 kPa) relief less 10 % (REFERENCES §13j, makers' sizing basis). */
function starterTank(doc: SystemDocument): Tank {
  const us = doc.unitSystem === 'US';
  return {
    heaterVolume: 0,
    coldTemperature: us ? 40 : 4,
    hotTemperature: doc.waterTemperature,
    supplyPressure: doc.source.staticPressureLow,
    reliefPressure: us ? 135 : 931,
  };
}

/** The tank's inputs, in the description's order; each row's label, unit and help come from the description (EXPANSION_TANK). */
const FIELDS: readonly (keyof Tank)[] = ['heaterVolume', 'coldTemperature', 'hotTemperature', 'supplyPressure', 'reliefPressure'];

/** The thermal expansion tank of a hot system: whether the system is closed, the tank's inputs and its size. */
export function ExpansionTankSection() {
  const { document, draft, readOnlyReason } = useWalk();
  const tank = document.expansionTank;
  const closed = closedSystemCheck(document);
  const sizing = sizeDocumentExpansionTank(document);
  const disabled = readOnlyReason !== null;
  const set = (key: keyof Tank, raw: string) => {
    const value = Number(raw.replace(',', '.'));
    if (raw.trim() === '' || !Number.isFinite(value)) return;
    draft.update((doc) => (doc.expansionTank ? { ...doc, expansionTank: { ...doc.expansionTank, [key]: value } } : doc));
  };
  return (
    <Section title="Thermal expansion tank" headingLevel={3}>
      <div className="flex flex-col gap-3 text-sm" data-testid="expansion-tank">
        <p className="max-w-prose">
          {closed.closed
            ? `The system is closed to thermal expansion by ${closed.closingElements.map(closingElementWords).join(', ')}: heated water cannot push back into the main.`
            : document.source.fedFrom
              ? 'Nothing in this system, nor in the cold system upstream of the heater feed (check valve, backflow preventer or PRV), closes it.'
              : 'Nothing in this system (check valve, backflow preventer or PRV) closes it; a closed cold system upstream of the heater closes it too — check there, or feed this system from it.'}
        </p>
        {tank ? (
          <>
            <div className="grid gap-3 md:grid-cols-2">
              {FIELDS.map((key) => (
                <TextField
                  key={key}
                  {...describedField(EXPANSION_TANK, key, document.unitSystem)}
                  type="text"
                  inputMode="decimal"
                  autoComplete="off"
                  disabled={disabled}
                  defaultValue={String(tank[key])}
                  onChange={(e) => set(key, e.target.value)}
                />
              ))}
            </div>
            {sizing?.ok ? (
              <p data-testid="expansion-tank-size">
                Tank volume needed:{' '}
                <strong>
                  {num(sizing.tankVolume, sizing.volumeUnit)} {sizing.volumeUnit}
                </strong>{' '}
                (the water gains {num(sizing.expansionVolume, sizing.volumeUnit)} {sizing.volumeUnit}; acceptance factor{' '}
                {num(sizing.result.acceptanceFactor, 'acceptance factor')}). Source: {sizing.result.source}.
              </p>
            ) : sizing ? (
              <p role="alert" className="font-semibold text-fault" data-testid="expansion-tank-error">
                <span aria-hidden="true">⚠ </span>
                {sizing.error.field ? `${sizing.error.field}: ` : ''}
                {sizing.error.message}
              </p>
            ) : null}
            {!disabled ? (
              <p>
                <Button
                  variant="quiet"
                  onClick={() =>
                    draft.update((doc) => {
                      const next = { ...doc };
                      delete next.expansionTank;
                      return next;
                    })
                  }
                >
                  Remove the expansion tank
                </Button>
              </p>
            ) : null}
          </>
        ) : (
          <>
            <p className={closed.cautionMissingTank ? 'font-semibold text-caution' : undefined}>
              {closed.cautionMissingTank ? '⚠ No expansion tank is described.' : 'No expansion tank is described.'}
            </p>
            {!disabled ? (
              <p>
                <Button variant="secondary" onClick={() => draft.update((doc) => ({ ...doc, expansionTank: starterTank(doc) }))}>
                  Describe and size an expansion tank
                </Button>
              </p>
            ) : null}
          </>
        )}
      </div>
    </Section>
  );
}
