import { describe, expect, it } from 'vitest';
import { acceptInvitationInputSchema } from '../../src/features/auth/api/accept-invitation';
import { addMemberInputSchema } from '../../src/features/members/api/add-member';
import { createProjectInputSchema } from '../../src/features/projects/api/create-project';
import { updateProjectInputSchema } from '../../src/features/projects/api/update-project';
import { canCreateProject, canEditProject, canManageMembers } from '../../src/features/projects/permissions';

const issuePaths = (result: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) =>
  (result.error?.issues ?? []).map((issue) => issue.path.join('.'));

describe('form schemas (derived from the shared API schemas)', () => {
  it('when the two passwords differ, then the second entry is the field in error', () => {
    const result = acceptInvitationInputSchema.safeParse({ password: 'long-enough-1', confirmPassword: 'long-enough-2' });
    expect(result.success).toBe(false);
    expect(issuePaths(result)).toEqual(['confirmPassword']);
  });

  it('when a password is shorter than the API allows, then the form refuses it before sending', () => {
    const result = acceptInvitationInputSchema.safeParse({ password: 'short', confirmPassword: 'short' });
    expect(issuePaths(result)).toContain('password');
  });

  it('when the edit form is sent, then it carries no version of its own (the version comes from when it was opened)', () => {
    const permit = { permitNumber: '', adoptedCode: '', localAmendments: '', preparerLicence: '', licenceJurisdiction: '' };
    const values = { name: 'Alder & Finch', address: '410 Quarry Lane', codeBasis: '', unitSystem: 'US', notes: '', permit };
    expect(updateProjectInputSchema.safeParse(values).success).toBe(true);
    expect(updateProjectInputSchema.safeParse({ ...values, version: 3 }).success).toBe(false);
    expect(issuePaths(updateProjectInputSchema.safeParse({ ...values, name: '  ' }))).toEqual(['name']);
  });

  it('when a new project has no name, then the name field is in error', () => {
    const permit = { permitNumber: '', adoptedCode: '', localAmendments: '', preparerLicence: '', licenceJurisdiction: '' };
    const result = createProjectInputSchema.safeParse({ name: '', address: '', codeBasis: '', unitSystem: 'SI', notes: '', permit });
    expect(issuePaths(result)).toEqual(['name']);
  });

  it('when the permit fields name a code Headroom does not offer or run too long, then each field is in error by its path', () => {
    const values = { name: 'Alder & Finch', address: '', codeBasis: '', unitSystem: 'US', notes: '' };
    const permit = {
      permitNumber: 'x'.repeat(81),
      adoptedCode: 'ipc-1997',
      localAmendments: '',
      preparerLicence: 'PE 40417',
      licenceJurisdiction: 'Wrenmoor (invented)',
    };
    expect(issuePaths(updateProjectInputSchema.safeParse({ ...values, permit })).sort()).toEqual(['permit.adoptedCode', 'permit.permitNumber']);
    expect(updateProjectInputSchema.safeParse({ ...values, permit: { ...permit, permitNumber: 'WRN-PC-2026-0418', adoptedCode: 'upc-2018' } }).success).toBe(
      true,
    );
  });

  it('when a member is added with a mixed-case e-mail, then it is sent trimmed and lower-cased', () => {
    expect(addMemberInputSchema.parse({ email: '  Contractor@Alder-Finch.Example ', role: 'contractor' }).email).toBe('contractor@alder-finch.example');
  });
});

describe('what the screens offer', () => {
  it('when an account is a designer or an administrator, then it is offered "New project"; others are not', () => {
    expect(canCreateProject({ isAdmin: false, accountRole: 'designer' })).toBe(true);
    expect(canCreateProject({ isAdmin: true, accountRole: 'inspector' })).toBe(true);
    expect(canCreateProject({ isAdmin: false, accountRole: 'contractor' })).toBe(false);
    expect(canCreateProject({ isAdmin: false, accountRole: 'inspector' })).toBe(false);
  });

  it('when the person is a designer member, then the project offers edit controls; contractors and inspectors read only', () => {
    expect(canEditProject({ myRole: 'designer' })).toBe(true);
    expect(canEditProject({ myRole: 'contractor' })).toBe(false);
    expect(canEditProject({ myRole: 'inspector' })).toBe(false);
    expect(canEditProject({ myRole: null })).toBe(false);
  });

  it('when an administrator is not a member, then members can be managed but details cannot be edited', () => {
    expect(canManageMembers({ myRole: null }, { isAdmin: true })).toBe(true);
    expect(canManageMembers({ myRole: 'designer' }, { isAdmin: false })).toBe(true);
    expect(canManageMembers({ myRole: 'contractor' }, { isAdmin: false })).toBe(false);
    expect(canManageMembers({ myRole: 'inspector' }, { isAdmin: false })).toBe(false);
  });
});
