import { NavLink } from 'react-router-dom';
import { cx } from '../../../components/ui/cx';
import { WALK_STEPS } from '../steps';
import type { StepLink } from '../steps';
import type { WalkLinks } from '../draft/walk-context';

/** The steps of the walk as numbered links; NavLink marks the current one with aria-current="page". */
export function StepNav({ links, steps = WALK_STEPS, label = 'Steps of the walk' }: { links: WalkLinks; steps?: readonly StepLink[]; label?: string }) {
  const linkClass = ({ isActive }: { isActive: boolean }) =>
    cx(
      'flex items-center gap-2 rounded-md border-2 px-3 py-1.5 text-sm font-semibold no-underline',
      isActive ? 'border-standpipe bg-standpipe text-paper hover:text-paper' : 'border-rule bg-surface text-standpipe hover:bg-standpipe-soft',
    );
  return (
    <nav aria-label={label} className="print:hidden">
      <ol className="flex flex-wrap gap-2">
        {steps.map((step, i) => (
          <li key={step.id}>
            <NavLink to={links.step(step.id)} className={linkClass} end>
              <span aria-hidden="true">{i + 1}. </span>
              {step.label}
            </NavLink>
          </li>
        ))}
      </ol>
      <p className="mt-2 flex flex-wrap gap-4 text-sm">
        {links.building ? <NavLink to={links.building}>Building: floors and typical units</NavLink> : null}
        {links.table ? <NavLink to={links.table}>Segment table</NavLink> : null}
        <NavLink to={links.diagram}>Riser diagram</NavLink>
        <NavLink to={links.up.href} end>
          {links.up.label}
        </NavLink>
      </p>
    </nav>
  );
}
