import { useEffect, useRef } from 'react';
import { useForm } from 'react-hook-form';
import type { DefaultValues, FieldValues, Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';

/**
 * A step's form: react-hook-form checked by the step's zod schema (built from the engine's
 * schema pieces) on every change. Each change that passes is handed to `apply`, which writes it
 * into the draft, so the live ledger follows the typing; a value that does not pass stays in the
 * form with its message and does not reach the draft.
 */
export function useLiveForm<T extends FieldValues, S extends z.ZodType>(
  schema: S,
  defaultValues: T,
  apply: (values: z.output<S>) => void,
) {
  const form = useForm<T>({
    resolver: zodResolver(schema as never) as unknown as Resolver<T>,
    defaultValues: defaultValues as DefaultValues<T>,
    mode: 'onChange',
  });
  const applyRef = useRef(apply);
  applyRef.current = apply;
  useEffect(() => {
    const subscription = form.watch((values) => {
      const parsed = schema.safeParse(values);
      if (parsed.success) applyRef.current(parsed.data);
    });
    return () => subscription.unsubscribe();
  }, [form, schema]);
  return form;
}
