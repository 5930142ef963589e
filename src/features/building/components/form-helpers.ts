import type { FieldError } from 'react-hook-form';
import { numberOrUndefined, plainError } from '../../walk/lib/form-values';

/** An empty number box is "not given" (undefined), never 0. */
export const asNumber = { setValueAs: numberOrUndefined } as const;

/** The message of a field's error in the screen's words. */
export const msg = (e: unknown) => plainError((e as FieldError | undefined)?.message);
