import { memo, useEffect, useState } from 'react';
import type { UnitSystem } from '../../../engine';
import { numberOrUndefined, RefusedNumber } from '../../walk/lib/form-values';
import { rangeMessage } from '../../walk/lib/limits';
import type { LimitKind } from '../../walk/lib/limits';

const CELL =
  'w-full min-w-0 rounded border-2 border-rule-strong bg-surface px-1.5 py-0.5 text-sm text-ink tabular-nums aria-[invalid=true]:border-fault read-only:border-rule read-only:bg-paper-deep disabled:bg-paper-deep';

/** A number as its box shows it: as typed, empty when not given. */
export const shownNumber = (v: number | undefined) => (v === undefined || !Number.isFinite(v) ? '' : String(v));
const show = shownNumber;

/**
 * A number typed in a row: what parses and is in range is handed on at once (the ledger follows the
 * typing); anything else stays in the box with its message, is reported as held (not saved), and
 * never reaches the document. Empty is "not given" only where `optional`.
 */
export const NumberCell = memo(function NumberCell(p: {
  label: string;
  value: number | undefined;
  kind: LimitKind;
  system: UnitSystem;
  optional: boolean;
  /** why the cell may not be changed, or null */
  locked: string | null;
  /** the id of the element holding the column's help */
  describedBy?: string;
  cellKey: string;
  col: number;
  row: number;
  onCommit: (cellKey: string, value: number | undefined) => void;
  onHeld: (cellKey: string, message: string | null) => void;
}) {
  const [text, setText] = useState(() => show(p.value));
  const [error, setError] = useState<string | null>(null);
  // a recycled row (the virtualised list) hands the box another segment's cell: start from its value
  const [cellKey, setCellKey] = useState(p.cellKey);
  if (cellKey !== p.cellKey) {
    setCellKey(p.cellKey);
    setText(show(p.value));
    setError(null);
  }
  // the document changed under the box (a bulk edit, an undo): show the new value unless the box holds a refused one
  useEffect(() => {
    setText((t) => {
      const parsed = numberOrUndefined(t);
      if (parsed instanceof RefusedNumber) return t;
      return parsed === p.value ? t : show(p.value);
    });
  }, [p.value]);
  const change = (next: string) => {
    setText(next);
    const parsed = numberOrUndefined(next);
    let message: string | null;
    if (parsed instanceof RefusedNumber) message = parsed.message;
    else if (parsed === undefined) message = p.optional ? null : 'Required';
    else if (!p.optional && parsed <= 0) message = 'Must be more than zero';
    else message = rangeMessage(p.kind, parsed, p.system);
    setError(message);
    p.onHeld(p.cellKey, message);
    if (message === null && !(parsed instanceof RefusedNumber)) p.onCommit(p.cellKey, parsed);
  };
  return (
    // the message floats under the box: the row keeps its fixed height (tree-editor.tsx, ROW_HEIGHT)
    <div className="relative flex flex-col">
      <input
        aria-label={p.label}
        aria-describedby={p.describedBy}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        className={CELL}
        value={text}
        readOnly={p.locked !== null}
        title={error ?? p.locked ?? undefined}
        aria-description={p.locked ?? undefined}
        aria-invalid={error ? true : undefined}
        data-col={p.col}
        data-row={p.row}
        onChange={(ev) => change(ev.target.value)}
      />
      {error ? (
        <span
          className="absolute left-0 top-full z-10 mt-0.5 w-max max-w-64 rounded border border-fault bg-surface px-1 text-xs font-medium text-fault shadow"
          role="alert"
        >
          <span aria-hidden="true">⚠ </span>
          {error}
        </span>
      ) : null}
    </div>
  );
});
