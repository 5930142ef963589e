import type { AccountRole } from '../shared/api/auth';
import type { ProjectRole } from '../shared/api/projects';

/** Screen words for the API's enumerations, in one place. */
export const ROLE_LABELS: Record<ProjectRole | AccountRole, string> = {
  designer: 'Designer',
  contractor: 'Contractor',
  inspector: 'Inspector',
};

/** The person's standing in a project: a role, or (for an administrator) none. */
export function myRoleLabel(role: ProjectRole | null): string {
  return role ? ROLE_LABELS[role] : 'Administrator, not a member';
}

export const UNIT_SYSTEM_LABELS: Record<'US' | 'SI', string> = {
  US: 'US customary (psi, ft, in, gpm, °F)',
  SI: 'SI (kPa, m, mm, L/s, °C)',
};

export const USER_STATUS_LABELS: Record<'invited' | 'active' | 'disabled', string> = {
  invited: 'Invited',
  active: 'Active',
  disabled: 'Disabled',
};

const dateTime = new Intl.DateTimeFormat('en', { dateStyle: 'medium', timeStyle: 'short' });
const dateOnly = new Intl.DateTimeFormat('en', { dateStyle: 'medium' });

export function formatDateTime(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateTime.format(date);
}

export function formatDate(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateOnly.format(date);
}
