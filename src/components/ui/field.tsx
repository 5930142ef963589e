import { useId } from 'react';
import type { ComponentProps, ReactNode } from 'react';
import { cx } from './cx';

const CONTROL =
  'block w-full rounded-md border-2 border-rule-strong bg-surface px-3 py-2 text-base text-ink placeholder:text-ink-muted aria-[invalid=true]:border-fault';

type Common = {
  label: string;
  /** what is wrong with the value, shown under the control and read out with it */
  error?: string;
  hint?: ReactNode;
  className?: string;
};

function useFieldIds(error?: string, hint?: ReactNode) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  return { id, hintId, errorId, describedBy: [hintId, errorId].filter(Boolean).join(' ') || undefined };
}

function FieldText({ hintId, hint, errorId, error }: { hintId?: string; hint?: ReactNode; errorId?: string; error?: string }) {
  return (
    <>
      {hint ? (
        <p id={hintId} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={errorId} className="text-sm font-medium text-fault">
          <span aria-hidden="true">⚠ </span>
          {error}
        </p>
      ) : null}
    </>
  );
}

export function TextField({ label, error, hint, className, ...input }: Common & ComponentProps<'input'>) {
  const ids = useFieldIds(error, hint);
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={ids.id} className="text-sm font-semibold text-ink">
        {label}
      </label>
      <input id={ids.id} className={CONTROL} aria-invalid={error ? true : undefined} aria-describedby={ids.describedBy} {...input} />
      <FieldText {...ids} hint={hint} error={error} />
    </div>
  );
}

export function TextAreaField({ label, error, hint, className, ...textarea }: Common & ComponentProps<'textarea'>) {
  const ids = useFieldIds(error, hint);
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={ids.id} className="text-sm font-semibold text-ink">
        {label}
      </label>
      <textarea id={ids.id} className={cx(CONTROL, 'min-h-24')} aria-invalid={error ? true : undefined} aria-describedby={ids.describedBy} {...textarea} />
      <FieldText {...ids} hint={hint} error={error} />
    </div>
  );
}

export type Option = { value: string; label: string };

export function SelectField({ label, error, hint, className, options, ...select }: Common & ComponentProps<'select'> & { options: readonly Option[] }) {
  const ids = useFieldIds(error, hint);
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={ids.id} className="text-sm font-semibold text-ink">
        {label}
      </label>
      <select id={ids.id} className={CONTROL} aria-invalid={error ? true : undefined} aria-describedby={ids.describedBy} {...select}>
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
      <FieldText {...ids} hint={hint} error={error} />
    </div>
  );
}

export function CheckboxField({ label, error, hint, className, ...input }: Common & Omit<ComponentProps<'input'>, 'type'>) {
  const ids = useFieldIds(error, hint);
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <div className="flex items-center gap-2">
        <input
          id={ids.id}
          type="checkbox"
          className="size-5 rounded border-2 border-rule-strong accent-standpipe"
          aria-invalid={error ? true : undefined}
          aria-describedby={ids.describedBy}
          {...input}
        />
        <label htmlFor={ids.id} className="text-sm font-semibold text-ink">
          {label}
        </label>
      </div>
      <FieldText {...ids} hint={hint} error={error} />
    </div>
  );
}
