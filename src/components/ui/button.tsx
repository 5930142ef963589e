import type { ComponentProps } from 'react';
import { cx } from './cx';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet' | 'inverse';

const VARIANTS: Record<Variant, string> = {
  primary: 'bg-standpipe text-paper border-standpipe hover:bg-standpipe-strong',
  secondary: 'bg-surface text-standpipe border-standpipe hover:bg-standpipe-soft',
  danger: 'bg-surface text-fault border-fault hover:bg-fault-soft',
  /** for the dark header band */
  inverse: 'bg-transparent text-paper border-paper hover:bg-standpipe-strong',
  quiet: 'bg-transparent text-standpipe border-transparent underline underline-offset-2 hover:text-standpipe-strong',
};

export type ButtonProps = ComponentProps<'button'> & {
  variant?: Variant;
  /** shows the button as busy and blocks a second press */
  pending?: boolean;
  pendingLabel?: string;
};

export function Button({ variant = 'primary', pending = false, pendingLabel, className, children, disabled, type = 'button', ...rest }: ButtonProps) {
  return (
    <button
      type={type}
      className={cx(
        'inline-flex items-center justify-center gap-2 rounded-md border-2 px-4 py-2 text-sm font-semibold',
        'disabled:cursor-not-allowed disabled:opacity-60',
        VARIANTS[variant],
        className,
      )}
      disabled={disabled || pending}
      aria-busy={pending || undefined}
      {...rest}
    >
      {pending ? (pendingLabel ?? children) : children}
    </button>
  );
}
