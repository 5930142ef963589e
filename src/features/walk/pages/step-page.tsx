import { Link, useParams } from 'react-router-dom';
import { NotFoundView } from '../../../components/errors/not-found-view';
import { useWalk } from '../draft/walk-context';
import { walkPaths } from '../paths';
import { isWalkStep, stepIndex, WALK_STEPS } from '../steps';
import type { WalkStepId } from '../steps';
import { DevicesStep } from '../steps/devices-step';
import { ElevationStep } from '../steps/elevation-step';
import { FittingsStep } from '../steps/fittings-step';
import { FixturesStep } from '../steps/fixtures-step';
import { ResultStep } from '../steps/result-step';
import { RisersStep } from '../steps/risers-step';
import { SupplyStep } from '../steps/supply-step';

const STEP_COMPONENTS: Record<WalkStepId, () => React.ReactNode> = {
  supply: SupplyStep,
  devices: DevicesStep,
  risers: RisersStep,
  fittings: FittingsStep,
  elevation: ElevationStep,
  fixtures: FixturesStep,
  result: ResultStep,
};

/** One step of the walk (its own address), with links to the step before and after. */
export function StepPage() {
  const { step } = useParams();
  const { ids } = useWalk();
  if (!isWalkStep(step)) return <NotFoundView />;
  const Step = STEP_COMPONENTS[step];
  const i = stepIndex(step);
  const prev = WALK_STEPS[i - 1];
  const next = WALK_STEPS[i + 1];
  const href = (id: WalkStepId) => walkPaths.step.getHref(ids.projectId, ids.systemId, ids.revisionId, id);
  return (
    <div data-testid={`step-${step}`}>
      <Step />
      <nav aria-label="Previous and next step" className="mt-8 flex flex-wrap justify-between gap-3 border-t-2 border-rule pt-4 print:hidden">
        {prev ? <Link to={href(prev.id)}>← {prev.label}</Link> : <span />}
        {next ? <Link to={href(next.id)} className="font-semibold">Next: {next.label} →</Link> : null}
      </nav>
    </div>
  );
}
