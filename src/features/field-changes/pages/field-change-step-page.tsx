import { useParams } from 'react-router-dom';
import { NotFoundView } from '../../../components/errors/not-found-view';
import { WalkContext, useWalk } from '../../walk/draft/walk-context';
import { StepPager } from '../../walk/pages/step-page';
import { DevicesStep } from '../../walk/steps/devices-step';
import { ElevationStep } from '../../walk/steps/elevation-step';
import { FittingsStep } from '../../walk/steps/fittings-step';
import { FixturesStep } from '../../walk/steps/fixtures-step';
import { SupplyStep } from '../../walk/steps/supply-step';
import { FIELD_CHANGE_STEPS, LOCKED_STEP_REASON, isFieldChangeStep } from '../steps';
import type { FieldChangeStepId } from '../steps';
import { PipeStep } from '../steps/pipe-step';

const STEP_COMPONENTS: Record<Exclude<FieldChangeStepId, 'effect'>, () => React.ReactNode> = {
  supply: SupplyStep,
  devices: DevicesStep,
  pipe: PipeStep,
  fittings: FittingsStep,
  elevation: ElevationStep,
  fixtures: FixturesStep,
};

const ignoreUpdate = () => undefined;

/**
 * One step of a field change: the walk's own step screens, with the ones that stay as issued
 * (supply, elevations, fixtures) shown read-only whoever opens them.
 */
export function FieldChangeStepPage() {
  const { step } = useParams();
  const walk = useWalk();
  if (!isFieldChangeStep(step) || step === 'effect') return <NotFoundView />;
  const i = FIELD_CHANGE_STEPS.findIndex((s) => s.id === step);
  const info = FIELD_CHANGE_STEPS[i];
  const Step = STEP_COMPONENTS[step];
  const readOnlyReason = info.editable ? walk.readOnlyReason : (walk.readOnlyReason ?? LOCKED_STEP_REASON);
  // A locked step's form must not write into the draft at all: even a value it only normalises
  // would be a change to what stays as issued, and the server refuses the whole save for it.
  const value = info.editable ? walk : { ...walk, readOnlyReason, draft: { ...walk.draft, update: ignoreUpdate } };
  return (
    <div data-testid={`step-${step}`}>
      {!info.editable ? (
        <p className="mb-4 rounded-md border-2 border-rule bg-paper-deep p-3 text-sm" data-testid="locked-step-note">
          {LOCKED_STEP_REASON}
        </p>
      ) : null}
      <WalkContext.Provider value={value}>
        <Step />
      </WalkContext.Provider>
      <StepPager previous={FIELD_CHANGE_STEPS[i - 1]} next={FIELD_CHANGE_STEPS[i + 1]} href={walk.links.step} />
    </div>
  );
}
