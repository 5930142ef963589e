import { cx } from '../../../components/ui/cx';

export type Verdict = 'pass' | 'fail' | 'unknown';

/**
 * Pass or fail, said by a word and a shape (a disc with a tick, a triangle with a bar), with
 * colour only repeating them: readable in grey print and by people who do not tell colours apart.
 */
export function VerdictShape({ verdict, size = 16 }: { verdict: Verdict; size?: number }) {
  if (verdict === 'pass') {
    return (
      <svg width={size} height={size} viewBox="0 0 16 16" aria-hidden="true" className="inline-block shrink-0 text-sound">
        <circle cx="8" cy="8" r="7" fill="currentColor" />
        <path d="M4.5 8.3 7 10.8 11.6 5.6" fill="none" stroke="white" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
    );
  }
  if (verdict === 'fail') {
    return (
      <svg width={size} height={size} viewBox="0 0 16 16" aria-hidden="true" className="inline-block shrink-0 text-fault">
        <path d="M8 1 15.5 14.5H.5Z" fill="currentColor" />
        <path d="M8 5.5v4.5M8 12v.6" stroke="white" strokeWidth="2" strokeLinecap="round" />
      </svg>
    );
  }
  return (
    <svg width={size} height={size} viewBox="0 0 16 16" aria-hidden="true" className="inline-block shrink-0 text-ink-muted">
      <rect x="1.5" y="1.5" width="13" height="13" rx="2" fill="none" stroke="currentColor" strokeWidth="2" strokeDasharray="3 2" />
    </svg>
  );
}

const WORDS: Record<Verdict, string> = { pass: 'Pass', fail: 'Fail', unknown: 'Not computed' };

export function VerdictMark({ verdict, children, className }: { verdict: Verdict; children?: React.ReactNode; className?: string }) {
  return (
    <span
      className={cx('inline-flex items-center gap-1.5 font-semibold', verdict === 'pass' ? 'text-sound' : verdict === 'fail' ? 'text-fault' : 'text-ink-muted', className)}
      data-verdict={verdict}
    >
      <VerdictShape verdict={verdict} />
      <span>{children ?? WORDS[verdict]}</span>
    </span>
  );
}

export function verdictOf(pass: boolean | null | undefined): Verdict {
  return pass === true ? 'pass' : pass === false ? 'fail' : 'unknown';
}
