import { useFieldArray, useFormContext, useWatch } from 'react-hook-form';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import type { SystemDocument } from '../../../engine';
import { CellInput, CellSelect } from '../../walk/components/cells';
import type { Catalog } from '../../systems/api/get-catalog';
import { materialChoices, sizeChoicesOf } from '../lib/choices';
import type { BuildingForm } from '../lib/form';
import { asNumber, msg } from './form-helpers';
import { ZonesSection } from './zones-section';

/** The riser builder's short form: where the riser starts, its pipe, the floor main, and the units along the main. */
export function RiserSection({
  catalog,
  document,
  lengthUnit,
  pressureUnit,
}: {
  catalog: Catalog;
  document: SystemDocument;
  lengthUnit: string;
  pressureUnit: string;
}) {
  const {
    control,
    register,
    getValues,
    setValue,
    formState: { errors },
  } = useFormContext<BuildingForm>();
  const sizeChanges = useFieldArray({ control, name: 'riser.sizeChanges' });
  const units = useFieldArray({ control, name: 'units' });
  const riser = useWatch({ control, name: 'riser' });
  const floors = useWatch({ control, name: 'floors.rows' });
  const types = useWatch({ control, name: 'unitTypes' });
  const unitValues = useWatch({ control, name: 'units' });
  const e = errors.riser;
  const floorOptions = (blank: string) => [{ value: '', label: blank }, ...floors.map((f) => ({ value: f.name, label: f.name }))];
  const nodeOptions = document.nodes.map((n) => ({ value: n.id, label: n.label ?? n.id }));
  const typeOptions = types.map((t) => ({ value: t.id, label: t.name || t.id }));
  return (
    <Section title="Riser builder">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Riser starts at
          <CellSelect label="Riser starts at" options={nodeOptions} error={msg(e?.startNodeId)} {...register('riser.startNodeId')} />
        </label>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          What follows the start point
          <CellSelect
            label="What follows the start point"
            options={[
              { value: 'replace', label: 'Replace what follows it' },
              { value: 'append', label: 'Add beside what is there' },
            ]}
            {...register('riser.mode')}
          />
        </label>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Riser from floor
          <CellSelect label="Riser from floor" options={floorOptions('the lowest floor')} error={msg(e?.fromFloor)} {...register('riser.fromFloor')} />
        </label>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Riser to floor
          <CellSelect label="Riser to floor" options={floorOptions('the highest floor')} error={msg(e?.toFloor)} {...register('riser.toFloor')} />
        </label>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Riser material
          <CellSelect
            label="Riser material"
            options={materialChoices(catalog)}
            error={msg(e?.material)}
            {...register('riser.material', {
              // the floor main is usually the riser's material: taken until one is chosen
              onChange: (ev: { target: { value: string } }) => {
                if (!getValues('riser.mainMaterial')) setValue('riser.mainMaterial', ev.target.value, { shouldValidate: true });
              },
            })}
          />
        </label>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Riser size
          <CellSelect label="Riser size" options={sizeChoicesOf(catalog, riser.material)} error={msg(e?.size)} {...register('riser.size')} />
        </label>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          {`Run to the foot of the riser (${lengthUnit})`}
          <CellInput
            label={`Run to the foot of the riser (${lengthUnit})`}
            inputMode="decimal"
            error={msg(e?.footLength)}
            {...register('riser.footLength', asNumber)}
          />
        </label>
        <span className="text-sm text-ink-muted">
          Each floor’s riser length is its floor-to-floor height; the foot’s run gets two 90° elbows (common practice).
        </span>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Floor main material
          <CellSelect label="Floor main material" options={materialChoices(catalog)} error={msg(e?.mainMaterial)} {...register('riser.mainMaterial')} />
        </label>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          Floor main size
          <CellSelect label="Floor main size" options={sizeChoicesOf(catalog, riser.mainMaterial)} error={msg(e?.mainSize)} {...register('riser.mainSize')} />
        </label>
        <label className="flex flex-col gap-1 text-xs font-semibold">
          {`Floor main height above floor (${lengthUnit})`}
          <CellInput
            label={`Floor main height above floor (${lengthUnit})`}
            inputMode="decimal"
            error={msg(e?.mainHeight)}
            {...register('riser.mainHeight', asNumber)}
          />
        </label>
      </div>
      <div className="mt-3 flex flex-col gap-1 text-sm">
        <p className="font-semibold">
          Riser size rule: {riser.size || 'the size above'} from the first floor{sizeChanges.fields.length ? ', then' : ''}
        </p>
        {sizeChanges.fields.map((f, i) => (
          <div key={f.id} className="flex gap-2">
            <CellSelect
              label={`Size change ${i + 1} from floor`}
              options={floorOptions('Floor…')}
              className="w-40"
              error={msg(e?.sizeChanges?.[i]?.fromFloor)}
              {...register(`riser.sizeChanges.${i}.fromFloor`)}
            />
            <CellSelect
              label={`Size change ${i + 1} size`}
              options={sizeChoicesOf(catalog, riser.material)}
              className="w-28"
              error={msg(e?.sizeChanges?.[i]?.size)}
              {...register(`riser.sizeChanges.${i}.size`)}
            />
            <Button variant="quiet" onClick={() => sizeChanges.remove(i)}>
              Remove
            </Button>
          </div>
        ))}
        <Button variant="quiet" className="self-start px-0" onClick={() => sizeChanges.append({ fromFloor: '', size: '' })}>
          + another size from a floor up
        </Button>
      </div>
      <table className="mt-4 w-full max-w-3xl text-sm">
        <caption className="text-left font-semibold">Units along the floor main, nearest the riser first (the same on every floor)</caption>
        <thead>
          <tr className="text-left">
            <th scope="col">Unit type</th>
            <th scope="col">
              Name ({'{floor}'}, {'{n}'})
            </th>
            <th scope="col">Main to its tap ({lengthUnit})</th>
            <th scope="col">Its branch ({lengthUnit}, blank: the type’s)</th>
            <th scope="col">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {units.fields.map((f, i) => (
            <tr key={f.id} className="align-top">
              <td className="pr-2 pb-1">
                <CellSelect
                  label={`Position ${i + 1} unit type`}
                  options={typeOptions}
                  error={msg(errors.units?.[i]?.unitTypeId)}
                  {...register(`units.${i}.unitTypeId`)}
                />
              </td>
              <td className="pr-2 pb-1">
                <CellInput label={`Position ${i + 1} name`} error={msg(errors.units?.[i]?.labelPattern)} {...register(`units.${i}.labelPattern`)} />
              </td>
              <td className="pr-2 pb-1">
                <CellInput
                  label={`Position ${i + 1} main length`}
                  inputMode="decimal"
                  error={msg(errors.units?.[i]?.mainLength)}
                  {...register(`units.${i}.mainLength`, asNumber)}
                />
              </td>
              <td className="pr-2 pb-1">
                <CellInput
                  label={`Position ${i + 1} branch length`}
                  inputMode="decimal"
                  error={msg(errors.units?.[i]?.branchLength)}
                  {...register(`units.${i}.branchLength`, asNumber)}
                />
              </td>
              <td className="pb-1">
                {units.fields.length > 1 ? (
                  <Button variant="quiet" onClick={() => units.remove(i)}>
                    Remove
                  </Button>
                ) : null}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <Button
        variant="secondary"
        className="mt-2"
        onClick={() => {
          const last = unitValues[unitValues.length - 1];
          units.append({
            unitTypeId: last?.unitTypeId ?? types[0]?.id ?? '',
            labelPattern: last?.labelPattern ?? 'Unit {floor}-{n}',
            mainLength: last?.mainLength,
          });
        }}
      >
        Add a unit position
      </Button>
      <ZonesSection pressureUnit={pressureUnit} />
    </Section>
  );
}
