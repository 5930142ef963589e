import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';

/** Said when a save was refused because the project changed meanwhile; nothing was overwritten. */
export function StaleVersionAlert({ onReload, reloading }: { onReload: () => void; reloading: boolean }) {
  return (
    <Alert
      tone="caution"
      title="Someone else changed this project since you opened it"
      actions={
        <Button onClick={onReload} pending={reloading} pendingLabel="Reloading…">
          Reload
        </Button>
      }
    >
      Your changes were not saved, and theirs were not overwritten. Reload to see the project as it is now, then make your change again.
    </Alert>
  );
}
