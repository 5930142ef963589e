import { useState } from 'react';
import type { Fitting, SystemDocument } from '../../../engine';
import type { Catalog } from '../../systems/api/get-catalog';
import { setFittings } from '../model';
import type { EditPolicy } from '../policy';
import type { DocChange } from './tree-editor';

const CONTROL = 'rounded border-2 border-rule-strong bg-surface px-1.5 py-0.5 text-sm disabled:bg-paper-deep';
const ACTION =
  'rounded-md border-2 border-standpipe bg-surface px-2 py-0.5 text-sm font-semibold text-standpipe disabled:cursor-not-allowed disabled:opacity-60';

/** A quick start for a segment: two standard 90° elbows and a tee, flow through the run (common practice, not a rule). */
export const USUAL_SET: readonly Fitting[] = [
  { typeId: 'elbow-90-standard', count: 2 },
  { typeId: 'tee-run', count: 1 },
];

/** The selection's bulk edits: one material, one size, a fittings set — each only where the policy lets it. */
export function BulkBar(p: {
  selected: ReadonlySet<string>;
  policy: EditPolicy;
  doc: SystemDocument;
  catalog: Catalog;
  materialOptions: readonly { value: string; label: string }[];
  sizeOptionsOf: (materialValue: string) => readonly { value: string; label: string }[];
  onMaterial: (ids: string[], value: string) => void;
  onSize: (ids: string[], size: string, materialValue?: string) => void;
  onChange: (change: DocChange) => void;
  onClear: () => void;
  pendingMaterial: ReadonlyMap<string, string>;
}) {
  const [material, setMaterial] = useState('');
  const [size, setSize] = useState('');
  const [fittingType, setFittingType] = useState(p.catalog.fittingTypes[0]?.id ?? '');
  const [fittingCount, setFittingCount] = useState('1');
  const [note, setNote] = useState<string | null>(null);
  if (p.selected.size === 0) return null;
  const ids = [...p.selected];
  // the size choices: the material chosen here, else the one material the selection shares
  const shared = new Set(ids.map((id) => p.pendingMaterial.get(id) ?? p.doc.segments.find((s) => s.id === id)?.material ?? ''));
  const sizeMaterial = material || (shared.size === 1 ? [...shared][0] : '');
  const count = Number(fittingCount);
  const countOk = Number.isInteger(count) && count >= 1 && count <= 999;
  const { locked } = p.policy;
  return (
    <section
      aria-label="Edit the selection"
      className="flex flex-wrap items-end gap-3 rounded-md border-2 border-standpipe bg-standpipe-soft/30 p-2 text-sm"
      data-testid="bulk-bar"
    >
      <p className="font-semibold" data-testid="bulk-count">
        {ids.length} selected
        <button type="button" className="ml-2 font-normal text-standpipe underline" onClick={p.onClear}>
          Clear
        </button>
      </p>
      <div className="flex items-end gap-1" title={locked.material ?? undefined}>
        <label className="flex flex-col text-xs font-semibold">
          Material for the selection
          <select
            className={CONTROL}
            value={material}
            disabled={locked.material !== null}
            aria-description={locked.material ?? undefined}
            onChange={(ev) => setMaterial(ev.target.value)}
          >
            <option value="">Choose…</option>
            {p.materialOptions
              .filter((o) => o.value !== '')
              .map((o) => (
                <option key={o.value} value={o.value}>
                  {o.label}
                </option>
              ))}
          </select>
        </label>
        <button
          type="button"
          className={ACTION}
          disabled={locked.material !== null || material === ''}
          onClick={() => {
            p.onMaterial(ids, material);
            setNote(`Material set on ${ids.length}.`);
          }}
        >
          Set material
        </button>
      </div>
      <div className="flex items-end gap-1" title={locked.size ?? undefined}>
        <label className="flex flex-col text-xs font-semibold">
          Size for the selection
          <select
            className={CONTROL}
            value={size}
            disabled={locked.size !== null || sizeMaterial === ''}
            aria-description={locked.size ?? undefined}
            onChange={(ev) => setSize(ev.target.value)}
          >
            {(sizeMaterial ? p.sizeOptionsOf(sizeMaterial) : [{ value: '', label: 'Choose one material first' }]).map((o) => (
              <option key={o.value} value={o.value}>
                {o.label}
              </option>
            ))}
          </select>
        </label>
        <button
          type="button"
          className={ACTION}
          disabled={locked.size !== null || size === ''}
          onClick={() => {
            p.onSize(ids, size, material || undefined);
            setNote(`Size ${size} set where the material has it.`);
          }}
        >
          Set size
        </button>
      </div>
      <div className="flex items-end gap-1" title={locked.fittings ?? undefined}>
        <label className="flex flex-col text-xs font-semibold">
          Fitting
          <select className={CONTROL} value={fittingType} disabled={locked.fittings !== null} onChange={(ev) => setFittingType(ev.target.value)}>
            {p.catalog.fittingTypes.map((f) => (
              <option key={f.id} value={f.id}>
                {f.label}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col text-xs font-semibold">
          Count
          <input
            className={`${CONTROL} w-14`}
            type="text"
            inputMode="numeric"
            value={fittingCount}
            disabled={locked.fittings !== null}
            aria-invalid={countOk ? undefined : true}
            onChange={(ev) => setFittingCount(ev.target.value)}
          />
        </label>
        <button
          type="button"
          className={ACTION}
          disabled={locked.fittings !== null || !countOk || fittingType === ''}
          onClick={() => {
            p.onChange((d) => setFittings(d, ids, [{ typeId: fittingType, count }], false));
            setNote(`${count}× added to ${ids.length}.`);
          }}
        >
          Add to each
        </button>
        <button
          type="button"
          className={ACTION}
          disabled={locked.fittings !== null}
          onClick={() => {
            p.onChange((d) => setFittings(d, ids, USUAL_SET, true));
            setNote(`Fittings of ${ids.length} replaced by the usual set.`);
          }}
        >
          Replace fittings with the usual set (2 elbows, 1 tee run)
        </button>
      </div>
      {!countOk ? (
        <p className="text-xs text-fault" role="alert">
          Count: a whole number from 1 to 999
        </p>
      ) : null}
      {note ? (
        <p className="text-xs text-ink-soft" aria-live="polite" data-testid="bulk-note">
          {note}
        </p>
      ) : null}
    </section>
  );
}
