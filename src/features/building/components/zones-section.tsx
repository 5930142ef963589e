import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { Button } from '../../../components/ui/button';
import { CellInput, CellSelect } from '../../walk/components/cells';
import type { BuildingForm } from '../lib/form';
import { asNumber, msg } from './form-helpers';

const FEEDS = [
  { value: 'supply', label: 'straight from the start point' },
  { value: 'prv', label: 'a pressure-reducing valve' },
  { value: 'booster-pump', label: 'a booster pump (variable speed)' },
];

/**
 * Pressure zones by floor range, lowest first: each zone gets its own riser from the start point,
 * with its PRV or booster at the base (riserBuilder.ts explains the arrangement). None: one riser.
 */
export function ZonesSection({ pressureUnit }: { pressureUnit: string }) {
  const {
    control,
    register,
    formState: { errors },
  } = useFormContext<BuildingForm>();
  const zones = useFieldArray({ control, name: 'riser.zones' });
  const floors = useWatch({ control, name: 'floors.rows' });
  const values = useWatch({ control, name: 'riser.zones' });
  const e = errors.riser?.zones;
  const floorOptions = [{ value: '', label: 'Floor…' }, ...floors.map((f) => ({ value: f.name, label: f.name }))];
  const nextFloor = () => {
    const last = values?.[values.length - 1];
    const at = last ? floors.findIndex((f) => f.name === last.toFloor) + 1 : 0;
    return floors[at]?.name ?? '';
  };
  return (
    <div className="mt-4 flex flex-col gap-2 text-sm" data-testid="riser-zones-form">
      <p className="font-semibold">Pressure zones</p>
      <p className="max-w-prose text-ink-soft">
        For a tall building: each range of floors gets its own riser from the start point, fed through a pressure-reducing valve (where the supply is too high
        for those floors) or a booster pump (where it is too low), at the base. A higher zone’s riser runs express, without branches, to its first floor.
        Without zones, one riser serves every floor straight from the start point. The valve and pump are written with no loss of their own: enter the product’s
        data in the Meter &amp; devices step.
      </p>
      {zones.fields.map((f, i) => (
        <div key={f.id} className="flex flex-wrap items-start gap-2" data-testid={`zone-row-${i + 1}`}>
          <span className="pt-1 font-semibold">Zone {i + 1}</span>
          <CellSelect
            label={`Zone ${i + 1} from floor`}
            options={floorOptions}
            className="w-36"
            error={msg(e?.[i]?.fromFloor)}
            {...register(`riser.zones.${i}.fromFloor`)}
          />
          <span className="pt-1">to</span>
          <CellSelect
            label={`Zone ${i + 1} to floor`}
            options={floorOptions}
            className="w-36"
            error={msg(e?.[i]?.toFloor)}
            {...register(`riser.zones.${i}.toFloor`)}
          />
          <span className="pt-1">through</span>
          <CellSelect label={`Zone ${i + 1} fed through`} options={FEEDS} className="w-64" {...register(`riser.zones.${i}.feed`)} />
          {values?.[i]?.feed !== 'supply' ? (
            <CellInput
              label={`Zone ${i + 1} set pressure (${pressureUnit})`}
              placeholder={`set, ${pressureUnit}`}
              inputMode="decimal"
              className="w-28"
              error={msg(e?.[i]?.setPressure)}
              {...register(`riser.zones.${i}.setPressure`, asNumber)}
            />
          ) : null}
          <Button variant="quiet" onClick={() => zones.remove(i)}>
            Remove
          </Button>
        </div>
      ))}
      <Button
        variant="secondary"
        className="self-start"
        onClick={() => zones.append({ fromFloor: nextFloor(), toFloor: '', feed: 'prv', setPressure: undefined })}
      >
        Add a pressure zone
      </Button>
    </div>
  );
}
