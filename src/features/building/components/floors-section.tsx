import { useState } from 'react';
import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { CellInput } from '../../walk/components/cells';
import { num } from '../../../shared/format/quantity';
import { floorElevations, type BuildingForm } from '../lib/form';
import { asNumber, msg } from './form-helpers';

/** The floors table: a name and an elevation per floor; a blank elevation is the one below plus the typical height. */
export function FloorsSection({ lengthUnit }: { lengthUnit: string }) {
  const {
    control,
    register,
    formState: { errors },
  } = useFormContext<BuildingForm>();
  const rows = useFieldArray({ control, name: 'floors.rows' });
  const values = useWatch({ control, name: 'floors' });
  const filled = floorElevations(values.rows, values.typicalHeight);
  const [count, setCount] = useState('');
  const addFloors = () => {
    const n = Number(count);
    if (!Number.isInteger(n) || n < 1 || n > 200) return;
    const start = rows.fields.length;
    rows.append(Array.from({ length: n }, (_, k) => ({ name: `Level ${start + k + 1}`, elevation: undefined })));
    setCount('');
  };
  return (
    <Section title="Floors">
      <div className="mb-3 flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Typical floor-to-floor height ({lengthUnit})
          <CellInput
            label={`Typical floor-to-floor height (${lengthUnit})`}
            inputMode="decimal"
            className="w-44"
            error={msg(errors.floors?.typicalHeight)}
            {...register('floors.typicalHeight', asNumber)}
          />
        </label>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Floors to add above
          <CellInput label="Floors to add" inputMode="numeric" className="w-32" value={count} onChange={(e) => setCount(e.target.value)} />
        </label>
        <Button variant="secondary" onClick={addFloors}>
          Add floors
        </Button>
      </div>
      <table className="w-full max-w-xl text-sm">
        <thead>
          <tr className="text-left">
            <th scope="col">Floor</th>
            <th scope="col">Elevation ({lengthUnit})</th>
            <th scope="col">Used</th>
            <th scope="col">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.fields.map((field, i) => (
            <tr key={field.id} className="align-top">
              <td className="pr-2 pb-1">
                <CellInput label={`Floor ${i + 1} name`} error={msg(errors.floors?.rows?.[i]?.name)} {...register(`floors.rows.${i}.name`)} />
              </td>
              <td className="pr-2 pb-1">
                <CellInput
                  label={`Floor ${i + 1} elevation`}
                  inputMode="decimal"
                  placeholder={filled[i] === null ? '' : `${num(filled[i], lengthUnit)} (typical)`}
                  error={msg(errors.floors?.rows?.[i]?.elevation)}
                  {...register(`floors.rows.${i}.elevation`, asNumber)}
                />
              </td>
              <td className="pr-2 pb-1 tabular-nums" data-testid={`floor-elevation-${i}`}>
                {num(filled[i], lengthUnit)}
              </td>
              <td className="pb-1">
                {rows.fields.length > 1 ? (
                  <Button variant="quiet" onClick={() => rows.remove(i)} aria-label={`Remove floor ${i + 1}`}>
                    Remove
                  </Button>
                ) : null}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {errors.floors?.rows?.root?.message ? <p className="text-sm text-fault">{errors.floors.rows.root.message}</p> : null}
    </Section>
  );
}
