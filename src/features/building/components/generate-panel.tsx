import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';

export interface PendingReplace {
  startLabel: string;
  segmentLabels: string[];
}

/** The confirmation that names what "Generate" replaces, and the undo of the last generation. */
export function GeneratePanel({
  pending,
  onConfirm,
  onCancel,
  done,
  onUndo,
  failure,
}: {
  pending: PendingReplace | null;
  onConfirm: () => void;
  onCancel: () => void;
  done: string | null;
  onUndo: (() => void) | null;
  failure: string | null;
}) {
  return (
    <div className="flex flex-col gap-3">
      {pending ? (
        <Alert
          tone="caution"
          title={`Replace ${pending.segmentLabels.length} segment${pending.segmentLabels.length === 1 ? '' : 's'} and unit${pending.segmentLabels.length === 1 ? '' : 's'} after “${pending.startLabel}”?`}
        >
          <p data-testid="replace-list">
            {pending.segmentLabels.slice(0, 12).join(', ')}
            {pending.segmentLabels.length > 12 ? ` and ${pending.segmentLabels.length - 12} more` : ''} — with their nodes, fixtures and devices. You can undo
            this.
          </p>
          <div className="mt-2 flex gap-2">
            <Button variant="danger" onClick={onConfirm}>
              Replace them
            </Button>
            <Button variant="secondary" onClick={onCancel}>
              Cancel
            </Button>
          </div>
        </Alert>
      ) : null}
      {failure ? (
        <Alert tone="fault" title="Nothing was generated">
          {failure}
        </Alert>
      ) : null}
      {done ? (
        <div className="flex flex-wrap items-center gap-3" role="status" data-testid="generated">
          <span>{done}</span>
          {onUndo ? (
            <Button variant="secondary" onClick={onUndo}>
              Undo generate
            </Button>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
