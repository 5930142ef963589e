import { useId } from 'react';
import type { ComponentProps } from 'react';
import { cx } from '../../../components/ui/cx';

const CELL = 'w-full min-w-0 rounded border-2 border-rule-strong bg-surface px-2 py-1 text-sm text-ink aria-[invalid=true]:border-fault disabled:bg-paper-deep';

/**
 * A cell's help (`hint`): not shown in the table, where the column says what the cell is, but read
 * out with the control as its description (aria-describedby).
 */
function useCellHint(hint: string | undefined) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  return {
    describedBy: hintId,
    text: hint ? (
      <span id={hintId} className="sr-only">
        {hint}
      </span>
    ) : null,
  };
}

/** An input inside a table: its name comes from `label` (the column and the row), read out but not shown. */
export function CellInput({ label, error, hint, className, ...input }: ComponentProps<'input'> & { label: string; error?: string; hint?: string }) {
  const help = useCellHint(hint);
  return (
    <div className={cx('flex flex-col', className)}>
      <input aria-label={label} aria-describedby={help.describedBy} title={error} className={CELL} aria-invalid={error ? true : undefined} {...input} />
      {help.text}
      {error ? (
        <span className="text-xs font-medium text-fault" role="alert">
          <span aria-hidden="true">⚠ </span>
          {error}
        </span>
      ) : null}
    </div>
  );
}

export function CellSelect({
  label,
  error,
  hint,
  className,
  options,
  ...select
}: ComponentProps<'select'> & { label: string; error?: string; hint?: string; options: readonly { value: string; label: string; disabled?: boolean }[] }) {
  const help = useCellHint(hint);
  return (
    <div className={cx('flex flex-col', className)}>
      <select aria-label={label} aria-describedby={help.describedBy} className={CELL} aria-invalid={error ? true : undefined} {...select}>
        {options.map((o) => (
          <option key={o.value} value={o.value} disabled={o.disabled}>
            {o.label}
          </option>
        ))}
      </select>
      {help.text}
      {error ? (
        <span className="text-xs font-medium text-fault" role="alert">
          <span aria-hidden="true">⚠ </span>
          {error}
        </span>
      ) : null}
    </div>
  );
}

/** A step's heading and its plain-words help. */
export function StepIntro({ title, children }: { title: string; children?: React.ReactNode }) {
  return (
    <div className="mb-4">
      <h2 className="text-2xl">{title}</h2>
      {children ? <div className="mt-1 max-w-prose text-ink-soft">{children}</div> : null}
    </div>
  );
}
