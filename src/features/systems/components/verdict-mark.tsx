import { cx } from '../../../components/ui/cx';

/**
 * What a verdict mark says. 'incomplete' is the engine's third verdict (something is missing or
 * assumed before Headroom can say pass or fail); 'unknown' is "not computed at all" (the engine
 * refused the input). Neither is ever drawn green.
 */
export type Verdict = 'pass' | 'fail' | 'incomplete' | 'unknown';

/** The SVG paths of each shape, shared by the page's marks and the riser diagram's own SVG. */
export function VerdictGlyph({ verdict }: { verdict: Verdict }) {
  if (verdict === 'pass') {
    return (
      <>
        <circle cx="8" cy="8" r="7" fill="currentColor" />
        <path d="M4.5 8.3 7 10.8 11.6 5.6" fill="none" stroke="white" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
      </>
    );
  }
  if (verdict === 'fail') {
    return (
      <>
        <path d="M8 1 15.5 14.5H.5Z" fill="currentColor" />
        <path d="M8 5.5v4.5M8 12v.6" stroke="white" strokeWidth="2" strokeLinecap="round" />
      </>
    );
  }
  if (verdict === 'incomplete') {
    // an open ring with a gap: "not closed yet" — no fill, so it never reads as the green disc
    return (
      <>
        <path d="M8 1.5a6.5 6.5 0 1 1-6.1 4.3" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
        <circle cx="8" cy="8" r="1.4" fill="currentColor" />
      </>
    );
  }
  return <rect x="1.5" y="1.5" width="13" height="13" rx="2" fill="none" stroke="currentColor" strokeWidth="2" strokeDasharray="3 2" />;
}

export const VERDICT_TEXT_CLASS: Record<Verdict, string> = {
  pass: 'text-sound',
  fail: 'text-fault',
  incomplete: 'text-caution',
  unknown: 'text-ink-muted',
};

/** The colour of each shape inside an SVG that cannot use the page's classes (the riser diagram). */
export const VERDICT_COLOUR: Record<Verdict, string> = {
  pass: '#22613f',
  fail: '#9b1c1c',
  incomplete: '#7a5200',
  unknown: '#56626b',
};

/**
 * Pass, fail or incomplete, said by a word and a shape (a disc with a tick, a triangle with a bar,
 * an open ring), with colour only repeating them: readable in grey print and by people who do
 * not tell colours apart.
 */
export function VerdictShape({ verdict, size = 16 }: { verdict: Verdict; size?: number }) {
  return (
    <svg
      width={size}
      height={size}
      viewBox="0 0 16 16"
      aria-hidden="true"
      className={cx('inline-block shrink-0', VERDICT_TEXT_CLASS[verdict])}
      data-shape={verdict}
    >
      <VerdictGlyph verdict={verdict} />
    </svg>
  );
}

export const VERDICT_WORDS: Record<Verdict, string> = { pass: 'Pass', fail: 'Fail', incomplete: 'Incomplete', unknown: 'Not computed' };

export function VerdictMark({ verdict, children, className }: { verdict: Verdict; children?: React.ReactNode; className?: string }) {
  return (
    <span className={cx('inline-flex items-center gap-1.5 font-semibold', VERDICT_TEXT_CLASS[verdict], className)} data-verdict={verdict}>
      <VerdictShape verdict={verdict} />
      <span>{children ?? VERDICT_WORDS[verdict]}</span>
    </span>
  );
}

/** A single check's pass flag (a fixture, a velocity): true → pass, false → fail, null → not computed. */
export function verdictOf(pass: boolean | null | undefined): Verdict {
  return pass === true ? 'pass' : pass === false ? 'fail' : 'unknown';
}

/**
 * A whole system's verdict from its status ('pass' | 'fail' | 'incomplete'); a missing status
 * (the engine refused the input) is 'unknown'. Never derive a system's verdict from pass flags:
 * an incomplete description may have every flag true.
 */
export function verdictOfStatus(status: 'pass' | 'fail' | 'incomplete' | null | undefined): Verdict {
  return status ?? 'unknown';
}

/**
 * A fixture's mark inside a system whose verdict is incomplete: its number is not yet a finding,
 * so a fixture that would pass is shown incomplete (never green); a failing one still says fail.
 */
export function fixtureVerdict(pass: boolean | null | undefined, systemStatus: 'pass' | 'fail' | 'incomplete' | null | undefined): Verdict {
  const own = verdictOf(pass);
  return own === 'pass' && systemStatus === 'incomplete' ? 'incomplete' : own;
}

/** A revision's verdict as the server lists it: its status, or "not computed" when it could not be analysed. */
export function revisionVerdict(v: { ok: boolean; status: 'pass' | 'fail' | 'incomplete' | null } | null | undefined): Verdict {
  return v && v.ok ? verdictOfStatus(v.status) : 'unknown';
}
