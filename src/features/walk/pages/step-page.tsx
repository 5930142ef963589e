import { Link, useParams } from 'react-router-dom';
import { NotFoundView } from '../../../components/errors/not-found-view';
import { useWalk } from '../draft/walk-context';
import { isWalkStep, stepIndex, WALK_STEPS } from '../steps';
import type { StepLink, WalkStepId } from '../steps';
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
  const { links } = useWalk();
  if (!isWalkStep(step)) return <NotFoundView />;
  const Step = STEP_COMPONENTS[step];
  const i = stepIndex(step);
  const prev = WALK_STEPS[i - 1];
  const next = WALK_STEPS[i + 1];
  return (
    <div data-testid={`step-${step}`}>
      <Step />
      <StepPager previous={prev} next={next} href={links.step} />
    </div>
  );
}

/** The links to the step before and after, under each step. */
export function StepPager({ previous, next, href }: { previous?: StepLink; next?: StepLink; href: (id: string) => string }) {
  return (
    <nav aria-label="Previous and next step" className="mt-8 flex flex-wrap justify-between gap-3 border-t-2 border-rule pt-4 print:hidden">
      {previous ? <Link to={href(previous.id)}>← {previous.label}</Link> : <span />}
      {next ? (
        <Link to={href(next.id)} className="font-semibold">
          Next: {next.label} →
        </Link>
      ) : null}
    </nav>
  );
}
