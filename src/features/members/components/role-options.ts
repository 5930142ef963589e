import { PROJECT_ROLES } from '../../../shared/api/projects';
import { ROLE_LABELS } from '../../../lib/labels';

export const ROLE_OPTIONS = PROJECT_ROLES.map((value) => ({ value, label: ROLE_LABELS[value] }));
