import { useId } from 'react';
import type { ReactNode } from 'react';
import { cx } from './cx';

/** A titled panel; the heading names the region for screen-reader navigation. */
export function Section({
  title,
  children,
  actions,
  className,
  headingLevel = 2,
}: {
  title: string;
  children: ReactNode;
  actions?: ReactNode;
  className?: string;
  headingLevel?: 2 | 3;
}) {
  const headingId = useId();
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  return (
    <section className={cx('rounded-lg border-2 border-rule bg-surface p-5', className)} aria-labelledby={headingId}>
      <div className="mb-4 flex flex-wrap items-center justify-between gap-3">
        <Heading id={headingId} className="text-xl">
          {title}
        </Heading>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </div>
      {children}
    </section>
  );
}
