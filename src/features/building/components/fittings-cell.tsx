import { useFieldArray, useFormContext } from 'react-hook-form';
import { Button } from '../../../components/ui/button';
import { CellInput, CellSelect } from '../../walk/components/cells';
import type { Catalog } from '../../systems/api/get-catalog';
import { fittingChoices } from '../lib/choices';
import type { BuildingForm } from '../lib/form';
import { msg } from './form-helpers';

/** The fittings on one piping row: type × count, added and removed in place. */
export function FittingsCell({ typeIndex, rowIndex, rowName, catalog }: { typeIndex: number; rowIndex: number; rowName: string; catalog: Catalog }) {
  const {
    control,
    register,
    formState: { errors },
  } = useFormContext<BuildingForm>();
  const name = `unitTypes.${typeIndex}.rows.${rowIndex}.fittings` as const;
  const list = useFieldArray({ control, name });
  const options = fittingChoices(catalog);
  const rowErrors = errors.unitTypes?.[typeIndex]?.rows?.[rowIndex]?.fittings;
  return (
    <div className="flex min-w-56 flex-col gap-1">
      {list.fields.map((f, k) => (
        <div key={f.id} className="flex gap-1">
          <CellSelect
            label={`${rowName} fitting ${k + 1}`}
            options={options}
            className="min-w-0 flex-1"
            error={msg(rowErrors?.[k]?.typeId)}
            {...register(`${name}.${k}.typeId`)}
          />
          <CellInput
            label={`${rowName} fitting ${k + 1} count`}
            inputMode="numeric"
            className="w-14"
            error={msg(rowErrors?.[k]?.count)}
            {...register(`${name}.${k}.count`, { setValueAs: (v) => (v === '' ? undefined : Number(v)) })}
          />
          <Button variant="quiet" className="px-1" aria-label={`Remove ${rowName} fitting ${k + 1}`} onClick={() => list.remove(k)}>
            ×
          </Button>
        </div>
      ))}
      <Button variant="quiet" className="self-start px-0 py-0" aria-label={`Add a fitting to ${rowName}`} onClick={() => list.append({ typeId: '', count: 1 })}>
        + fitting
      </Button>
    </div>
  );
}
