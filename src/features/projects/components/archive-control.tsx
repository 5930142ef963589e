import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { errorMessage, isStaleVersion } from '../../../lib/error-messages';
import type { Project } from '../../../shared/api/projects';
import { useUpdateProject } from '../api/update-project';
import { StaleVersionAlert } from './stale-version-alert';

/** Archive (set aside, still readable) or bring back a project, asking once before archiving. */
export function ArchiveControl({ project, reload }: { project: Project; reload: () => Promise<unknown> }) {
  const update = useUpdateProject();
  const [confirming, setConfirming] = useState(false);
  const [reloading, setReloading] = useState(false);

  const setArchived = (archived: boolean) =>
    update.mutate({ projectId: project.id, body: { archived, version: project.version } }, { onSuccess: () => setConfirming(false) });

  const onReload = async () => {
    setReloading(true);
    try {
      await reload();
      update.reset();
    } finally {
      setReloading(false);
    }
  };

  return (
    <div className="flex flex-col gap-3">
      <div aria-live="assertive">
        {update.isError && isStaleVersion(update.error) ? <StaleVersionAlert onReload={onReload} reloading={reloading} /> : null}
        {update.isError && !isStaleVersion(update.error) ? (
          <Alert tone="fault" title="Not changed">
            {errorMessage(update.error)}
          </Alert>
        ) : null}
      </div>
      {project.archived ? (
        <div className="flex flex-wrap items-center gap-3">
          <p>This project is archived: it is kept and can be read, and it is listed apart from the active ones.</p>
          <Button variant="secondary" pending={update.isPending} pendingLabel="Restoring…" onClick={() => setArchived(false)}>
            Restore project
          </Button>
        </div>
      ) : confirming ? (
        <div className="flex flex-wrap items-center gap-3" role="group" aria-label="Confirm archiving">
          <p>Archive “{project.name}”? Members can still read it; it moves to the archived list.</p>
          <Button variant="danger" pending={update.isPending} pendingLabel="Archiving…" onClick={() => setArchived(true)}>
            Yes, archive it
          </Button>
          <Button variant="secondary" onClick={() => setConfirming(false)}>
            Keep it active
          </Button>
        </div>
      ) : (
        <div>
          <Button variant="secondary" onClick={() => setConfirming(true)}>
            Archive project…
          </Button>
        </div>
      )}
    </div>
  );
}
