import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { Button } from '../../../components/ui/button';
import { CellInput, CellSelect } from '../../walk/components/cells';
import type { Catalog } from '../../systems/api/get-catalog';
import { fixtureChoices, materialChoices, sizeChoicesOf } from '../lib/choices';
import { newFixtureRow } from '../lib/defaults';
import type { BuildingForm } from '../lib/form';
import { FittingsCell } from './fittings-cell';
import { asNumber, msg } from './form-helpers';

/**
 * One unit type: a row per point of the unit (its manifold, each fixture) with the pipe that
 * feeds it. Defined once; every placement of the type follows it.
 */
export function UnitTypeEditor({ index, catalog, lengthUnit, onRemove }: { index: number; catalog: Catalog; lengthUnit: string; onRemove?: () => void }) {
  const {
    control,
    register,
    getValues,
    setValue,
    formState: { errors },
  } = useFormContext<BuildingForm>();
  const rows = useFieldArray({ control, name: `unitTypes.${index}.rows`, keyName: 'fieldKey' });
  const values = useWatch({ control, name: `unitTypes.${index}` });
  const e = errors.unitTypes?.[index];
  const typeName = values.name || `Unit type ${index + 1}`;
  return (
    <div className="flex flex-col gap-3 rounded-md border-2 border-rule p-3" data-testid={`unit-type-${index}`}>
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Unit type name
          <CellInput label={`Unit type ${index + 1} name`} className="w-56" error={msg(e?.name)} {...register(`unitTypes.${index}.name`)} />
        </label>
        {onRemove ? (
          <Button variant="quiet" onClick={onRemove}>
            Remove this unit type
          </Button>
        ) : null}
      </div>
      <div className="overflow-x-auto">
        <table className="w-full text-sm">
          <thead>
            <tr className="text-left align-bottom">
              <th scope="col">Point</th>
              <th scope="col">Fed from</th>
              <th scope="col">Height above floor ({lengthUnit})</th>
              <th scope="col">Fixture × count</th>
              <th scope="col">Check</th>
              <th scope="col">Pipe: material, size</th>
              <th scope="col">Length ({lengthUnit})</th>
              <th scope="col">Fittings</th>
              <th scope="col">
                <span className="sr-only">Remove</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.fields.map((field, i) => {
              const row = values.rows[i] ?? field;
              const label = `${typeName}, ${row.name || `point ${i + 1}`}`;
              const re = e?.rows?.[i];
              const fromOptions =
                i === 0
                  ? [{ value: 'inlet', label: 'the tap on the floor main' }]
                  : values.rows.slice(0, i).map((r) => ({ value: r.key, label: r.name || '(unnamed)' }));
              return (
                <tr key={field.fieldKey} className="border-t border-rule align-top">
                  <td className="py-1 pr-2">
                    <CellInput
                      label={`${typeName} point ${i + 1} name`}
                      className="w-36"
                      error={msg(re?.name)}
                      {...register(`unitTypes.${index}.rows.${i}.name`)}
                    />
                  </td>
                  <td className="py-1 pr-2">
                    <CellSelect
                      label={`${label} fed from`}
                      options={fromOptions}
                      className="w-36"
                      error={msg(re?.from)}
                      {...register(`unitTypes.${index}.rows.${i}.from`)}
                    />
                  </td>
                  <td className="py-1 pr-2">
                    <CellInput
                      label={`${label} height above floor`}
                      inputMode="decimal"
                      className="w-20"
                      error={msg(re?.heightAboveFloor)}
                      {...register(`unitTypes.${index}.rows.${i}.heightAboveFloor`, asNumber)}
                    />
                  </td>
                  <td className="py-1 pr-2">
                    <div className="flex gap-1">
                      <CellSelect
                        label={`${label} fixture`}
                        options={fixtureChoices(catalog)}
                        className="w-48"
                        {...register(`unitTypes.${index}.rows.${i}.fixtureTypeId`, {
                          // a point named after its fixture unless the designer named it
                          onChange: (ev: { target: { value: string } }) => {
                            const fixture = catalog.fixtureType(ev.target.value);
                            if (fixture && !getValues(`unitTypes.${index}.rows.${i}.name`))
                              setValue(`unitTypes.${index}.rows.${i}.name`, fixture.label, { shouldValidate: true });
                          },
                        })}
                      />
                      {row.fixtureTypeId ? (
                        <CellInput
                          label={`${label} fixture count`}
                          inputMode="numeric"
                          className="w-14"
                          error={msg(re?.count)}
                          {...register(`unitTypes.${index}.rows.${i}.count`, asNumber)}
                        />
                      ) : null}
                    </div>
                  </td>
                  <td className="py-1 pr-2">
                    <input
                      type="checkbox"
                      aria-label={`Check ${label}`}
                      className="size-5 accent-standpipe"
                      disabled={!row.fixtureTypeId}
                      {...register(`unitTypes.${index}.rows.${i}.checked`)}
                    />
                    {re?.checked ? <span className="block text-xs text-fault">{msg(re.checked)}</span> : null}
                  </td>
                  <td className="py-1 pr-2">
                    <div className="flex gap-1">
                      <CellSelect
                        label={`${label} material`}
                        options={materialChoices(catalog)}
                        className="w-40"
                        error={msg(re?.material)}
                        {...register(`unitTypes.${index}.rows.${i}.material`)}
                      />
                      <CellSelect
                        label={`${label} size`}
                        options={sizeChoicesOf(catalog, row.material)}
                        className="w-24"
                        error={msg(re?.size)}
                        {...register(`unitTypes.${index}.rows.${i}.size`)}
                      />
                    </div>
                  </td>
                  <td className="py-1 pr-2">
                    <CellInput
                      label={`${label} length`}
                      inputMode="decimal"
                      className="w-20"
                      error={msg(re?.length)}
                      {...register(`unitTypes.${index}.rows.${i}.length`, asNumber)}
                    />
                  </td>
                  <td className="py-1 pr-2">
                    <FittingsCell typeIndex={index} rowIndex={i} rowName={label} catalog={catalog} />
                  </td>
                  <td className="py-1">
                    {i > 0 ? (
                      <Button variant="quiet" aria-label={`Remove ${label}`} onClick={() => rows.remove(i)}>
                        ×
                      </Button>
                    ) : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <Button variant="secondary" className="self-start" onClick={() => rows.append(newFixtureRow(values.rows))}>
        Add a point to {typeName}
      </Button>
    </div>
  );
}
