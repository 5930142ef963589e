import { Badge } from '../../../components/ui/badge';
import type { FieldChangeStatus } from '../../../shared/api/fieldChanges';

const TONE = { draft: 'standpipe', proposed: 'caution', accepted: 'sound', declined: 'fault' } as const;
const WORDS: Record<FieldChangeStatus, string> = { draft: 'Draft', proposed: 'Proposed', accepted: 'Accepted', declined: 'Declined' };

export function FieldChangeStatusBadge({ status }: { status: FieldChangeStatus }) {
  return <Badge tone={TONE[status]}>{WORDS[status]}</Badge>;
}
