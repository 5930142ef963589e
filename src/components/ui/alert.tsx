import type { ReactNode } from 'react';
import { cx } from './cx';

type Tone = 'fault' | 'caution' | 'sound' | 'info';

const TONES: Record<Tone, { box: string; word: string }> = {
  fault: { box: 'border-fault bg-fault-soft text-ink', word: 'Problem' },
  caution: { box: 'border-caution bg-caution-soft text-ink', word: 'Note' },
  sound: { box: 'border-sound bg-sound-soft text-ink', word: 'Done' },
  info: { box: 'border-standpipe bg-standpipe-soft text-ink', word: 'Information' },
};

/**
 * A message box that screen readers announce: `role="alert"` for failures (assertive),
 * `role="status"` otherwise (polite). Its tone is also written as a word, not shown by colour alone.
 */
export function Alert({
  tone = 'info',
  title,
  children,
  actions,
  className,
}: {
  tone?: Tone;
  title?: string;
  children?: ReactNode;
  actions?: ReactNode;
  className?: string;
}) {
  const { box, word } = TONES[tone];
  return (
    <div role={tone === 'fault' ? 'alert' : 'status'} className={cx('rounded-md border-l-8 border-2 px-4 py-3', box, className)}>
      <p className="font-semibold">
        <span className="sr-only">{word}: </span>
        {title ?? word}
      </p>
      {children ? <div className="mt-1 text-sm">{children}</div> : null}
      {actions ? <div className="mt-3 flex flex-wrap gap-2">{actions}</div> : null}
    </div>
  );
}

/** A live region that is always in the page, so that messages put into it are read out. */
export function LiveMessage({ message, tone = 'info' }: { message: string | null; tone?: Tone }) {
  return (
    <div aria-live={tone === 'fault' ? 'assertive' : 'polite'} aria-atomic="true">
      {message ? <Alert tone={tone} title={message} /> : null}
    </div>
  );
}
