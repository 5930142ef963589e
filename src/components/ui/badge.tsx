import type { ReactNode } from 'react';
import { cx } from './cx';

type Tone = 'neutral' | 'standpipe' | 'copper' | 'fault' | 'sound' | 'caution';

const TONES: Record<Tone, string> = {
  neutral: 'border-rule-strong bg-paper-deep text-ink',
  standpipe: 'border-standpipe bg-standpipe-soft text-standpipe-strong',
  copper: 'border-copper bg-copper-soft text-ink',
  fault: 'border-fault bg-fault-soft text-fault',
  sound: 'border-sound bg-sound-soft text-sound',
  caution: 'border-caution bg-caution-soft text-caution',
};

/** A short word label; the word carries the meaning, the colour only repeats it. */
export function Badge({ tone = 'neutral', children }: { tone?: Tone; children: ReactNode }) {
  return <span className={cx('inline-block rounded border px-2 py-0.5 text-xs font-semibold uppercase tracking-wide', TONES[tone])}>{children}</span>;
}
