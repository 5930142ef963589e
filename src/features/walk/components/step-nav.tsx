import { NavLink } from 'react-router-dom';
import { cx } from '../../../components/ui/cx';
import { walkPaths } from '../paths';
import { WALK_STEPS } from '../steps';
import type { WalkIds } from '../draft/walk-context';

/** The steps of the walk as numbered links; NavLink marks the current one with aria-current="page". */
export function StepNav({ ids }: { ids: WalkIds }) {
  const { projectId, systemId, revisionId } = ids;
  const linkClass = ({ isActive }: { isActive: boolean }) =>
    cx(
      'flex items-center gap-2 rounded-md border-2 px-3 py-1.5 text-sm font-semibold no-underline',
      isActive ? 'border-standpipe bg-standpipe text-paper hover:text-paper' : 'border-rule bg-surface text-standpipe hover:bg-standpipe-soft',
    );
  return (
    <nav aria-label="Steps of the walk" className="print:hidden">
      <ol className="flex flex-wrap gap-2">
        {WALK_STEPS.map((step, i) => (
          <li key={step.id}>
            <NavLink to={walkPaths.step.getHref(projectId, systemId, revisionId, step.id)} className={linkClass}>
              <span aria-hidden="true">{i + 1}. </span>
              {step.label}
            </NavLink>
          </li>
        ))}
      </ol>
      <p className="mt-2 flex flex-wrap gap-4 text-sm">
        <NavLink to={walkPaths.table.getHref(projectId, systemId, revisionId)}>Segment table</NavLink>
        <NavLink to={walkPaths.diagram.getHref(projectId, systemId, revisionId)}>Riser diagram</NavLink>
        <NavLink to={walkPaths.system.getHref(projectId, systemId)} end>
          System overview and revisions
        </NavLink>
      </p>
    </nav>
  );
}
