import { useContext, useEffect, useId, useMemo, useRef } from 'react';
import { useForm } from 'react-hook-form';
import type { DefaultValues, FieldError, FieldErrors, FieldValues, Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import type { UnitSystem } from '../../../engine';
import { WalkContext } from '../draft/walk-context';
import { plainError, RefusedNumber } from './form-values';
import { limitKindOf, rangeMessage } from './limits';

import type { HeldValue } from '../draft/use-draft';

/**
 * The number fields' own checks, over what the form holds: a text that is not a number (with its
 * message: "Enter a number", or what to do about a decimal comma), a number outside its plain
 * range ("Out of range: length 0–5,000 ft"), and an empty required box said as "Required".
 */
export function numberChecks(values: unknown, system: UnitSystem): HeldValue[] {
  const out: HeldValue[] = [];
  const walk = (v: unknown, path: string) => {
    if (v instanceof RefusedNumber) out.push({ path, message: v.message });
    else if (typeof v === 'number') {
      const kind = limitKindOf(path);
      const message = kind ? rangeMessage(kind, v, system) : null;
      if (message) out.push({ path, message });
    } else if (Array.isArray(v)) v.forEach((x, i) => walk(x, path ? `${path}.${i}` : String(i)));
    else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) walk(x, path ? `${path}.${k}` : k);
  };
  walk(values, '');
  return out;
}

function setError(errors: Record<string, unknown>, path: string, error: FieldError) {
  const keys = path.split('.');
  let at: Record<string, unknown> = errors;
  keys.forEach((key, i) => {
    if (i === keys.length - 1) at[key] = error;
    else {
      const next = at[key];
      at[key] = next && typeof next === 'object' ? next : /^\d+$/.test(keys[i + 1]) ? [] : {};
      at = at[key] as Record<string, unknown>;
    }
  });
}

function leafErrors(errors: FieldErrors, path = ''): HeldValue[] {
  const out: HeldValue[] = [];
  for (const [k, v] of Object.entries(errors ?? {})) {
    if (!v || typeof v !== 'object' || k === 'ref') continue;
    const p = path ? `${path}.${k}` : k;
    if (typeof (v as FieldError).message === 'string' && (v as FieldError).type !== undefined) out.push({ path: p, message: (v as FieldError).message! });
    else out.push(...leafErrors(v as FieldErrors, p));
  }
  return out;
}

function valueAt(values: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((v, k) => (v && typeof v === 'object' ? (v as Record<string, unknown>)[k] : undefined), values);
}

/**
 * A step's form: react-hook-form checked by the step's zod schema (built from the engine's
 * schema pieces) and the number fields' plain limits, on every change. Each change that passes
 * both is handed to `apply`, which writes it into the draft, so the live ledger follows the
 * typing; a value that does not pass stays in the form with its message, does not reach the
 * draft, and is reported to the draft so the save state says it is not saved.
 */
export function useLiveForm<T extends FieldValues, S extends z.ZodType>(schema: S, defaultValues: T, apply: (values: z.output<S>) => void) {
  const walk = useContext(WalkContext);
  const system: UnitSystem = walk?.document.unitSystem ?? 'US';
  const report = walk?.draft.reportHeld;
  const formKey = useId();
  const resolver = useMemo((): Resolver<T> => {
    const base = zodResolver(schema as never) as unknown as Resolver<T>;
    return async (values, context, options) => {
      const result = await base(values, context, options);
      const checks = numberChecks(values, system);
      const emptyRequired = leafErrors(result.errors).filter((e) => valueAt(values, e.path) === undefined && /number/i.test(e.message));
      if (checks.length === 0 && emptyRequired.length === 0) return result;
      const errors = { ...(result.errors as Record<string, unknown>) };
      for (const e of emptyRequired) setError(errors, e.path, { type: 'required', message: 'Required' });
      for (const c of checks) setError(errors, c.path, { type: 'range', message: c.message });
      return { values: {}, errors: errors as FieldErrors<T> };
    };
  }, [schema, system]);
  const form = useForm<T>({ resolver, defaultValues: defaultValues as DefaultValues<T>, mode: 'onChange' });
  const applyRef = useRef(apply);
  applyRef.current = apply;
  useEffect(() => {
    const subscription = form.watch((values) => {
      const checks = numberChecks(values, system);
      const parsed = schema.safeParse(values);
      if (parsed.success && checks.length === 0) applyRef.current(parsed.data);
      if (report) {
        const issues = parsed.success
          ? []
          : parsed.error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: plainError(i.message) ?? i.message }));
        const seen = new Set(checks.map((c) => c.path));
        report(formKey, [...checks, ...issues.filter((i) => !seen.has(i.path))]);
      }
    });
    return () => subscription.unsubscribe();
  }, [form, schema, system, report, formKey]);
  // a step that is left forgets what it held (its values were never in the draft)
  useEffect(() => () => report?.(formKey, []), [report, formKey]);
  return form;
}
