import { useNavigate, useParams } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/error-messages';
import { useNewDraft } from '../../systems/api/new-draft';
import { walkPaths } from '../paths';
import { isWalkStep } from '../steps';
import type { WalkIds } from '../draft/walk-context';

/** Issued and superseded revisions never change; a designer starts a new draft from one instead. */
export function NewDraftButton({ ids }: { ids: WalkIds }) {
  const create = useNewDraft();
  const navigate = useNavigate();
  const { step } = useParams();
  const onClick = () =>
    create.mutate(
      { projectId: ids.projectId, systemId: ids.systemId, fromRevisionId: ids.revisionId },
      {
        onSuccess: (revision) => navigate(walkPaths.step.getHref(ids.projectId, ids.systemId, revision.id, isWalkStep(step) ? step : 'supply')),
      },
    );
  return (
    <div className="flex flex-col gap-2">
      <div>
        <Button onClick={onClick} pending={create.isPending} pendingLabel="Starting a draft…">
          Start a new draft from this revision
        </Button>
      </div>
      <div aria-live="assertive">
        {create.isError ? (
          <Alert tone="fault" title="No new draft">
            {errorMessage(create.error)}
          </Alert>
        ) : null}
      </div>
    </div>
  );
}
