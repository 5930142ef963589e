import { z } from 'zod';
import { Email } from './auth';

export const PROJECT_ROLES = ['designer', 'contractor', 'inspector'] as const;
export const ProjectRole = z.enum(PROJECT_ROLES);
export type ProjectRole = z.infer<typeof ProjectRole>;

export const UNIT_SYSTEMS = ['US', 'SI'] as const;
export const UnitSystem = z.enum(UNIT_SYSTEMS);

/**
 * The model codes and editions whose tables Headroom's catalog data are taken from (the sources in
 * src/engine/catalog name the IPC 2018 and UPC 2018 tables and the NSPC's velocity limits, whose
 * edition the catalog does not fix). The designer picks the one the jurisdiction adopted and
 * states local amendments as text; "other" says the adopted code is none of these.
 */
export const ADOPTED_CODES = ['', 'ipc-2018', 'upc-2018', 'nspc', 'other'] as const;
export const ADOPTED_CODE_LABELS: Record<(typeof ADOPTED_CODES)[number], string> = {
  '': 'not stated',
  'ipc-2018': 'International Plumbing Code, 2018 edition',
  'upc-2018': 'Uniform Plumbing Code, 2018 edition',
  nspc: 'National Standard Plumbing Code (edition as stated in the amendments)',
  other: 'another code (stated in the amendments)',
};
export const AdoptedCode = z.enum(ADOPTED_CODES);

/** The permit fields as a form holds them: every field present. */
export const PermitFormFields = z.object({
  permitNumber: z.string().trim().max(80, 'At most 80 characters'),
  adoptedCode: AdoptedCode,
  localAmendments: z.string().trim().max(2000, 'At most 2000 characters'),
  preparerLicence: z.string().trim().max(80, 'At most 80 characters'),
  licenceJurisdiction: z.string().trim().max(120, 'At most 120 characters'),
});
/** What a plan reviewer looks for on every page: the permit, the code adopted, the preparer's licence. */
export const PermitFields = z.object({
  permitNumber: PermitFormFields.shape.permitNumber.default(''),
  adoptedCode: AdoptedCode.default(''),
  localAmendments: PermitFormFields.shape.localAmendments.default(''),
  preparerLicence: PermitFormFields.shape.preparerLicence.default(''),
  licenceJurisdiction: PermitFormFields.shape.licenceJurisdiction.default(''),
});
export type PermitFields = z.infer<typeof PermitFields>;
export const EMPTY_PERMIT: PermitFields = { permitNumber: '', adoptedCode: '', localAmendments: '', preparerLicence: '', licenceJurisdiction: '' };

const projectFields = {
  name: z.string().trim().min(1, 'Enter a project name').max(160),
  address: z.string().trim().max(300).default(''),
  /** free text the designer states: code edition and local amendments */
  codeBasis: z.string().trim().max(2000).default(''),
  unitSystem: UnitSystem.default('US'),
  notes: z.string().max(10_000).default(''),
  permit: PermitFields.strict().optional(),
};

export const CreateProjectBody = z.object(projectFields).strict();
export type CreateProjectBody = z.input<typeof CreateProjectBody>;

export const UpdateProjectBody = z
  .object({
    name: projectFields.name.optional(),
    address: z.string().trim().max(300).optional(),
    codeBasis: z.string().trim().max(2000).optional(),
    unitSystem: UnitSystem.optional(),
    notes: z.string().max(10_000).optional(),
    permit: PermitFields.strict().optional(),
    archived: z.boolean().optional(),
    version: z.number().int().min(1),
  })
  .strict();
export type UpdateProjectBody = z.infer<typeof UpdateProjectBody>;

export const Project = z.object({
  id: z.string(),
  name: z.string(),
  address: z.string(),
  codeBasis: z.string(),
  unitSystem: UnitSystem,
  notes: z.string(),
  permit: PermitFields.default(() => ({ ...EMPTY_PERMIT })),
  archived: z.boolean(),
  version: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
  /** the signed-in user's role in this project; null for a site administrator who is not a member */
  myRole: ProjectRole.nullable(),
  /** how many of the project's systems are returned by the inspector and not yet answered by a newer issued revision */
  returnedSystems: z.number().int().optional(),
});
export type Project = z.infer<typeof Project>;

export const Member = z.object({
  userId: z.string(),
  email: z.string(),
  name: z.string(),
  role: ProjectRole,
  addedAt: z.string(),
});
export type Member = z.infer<typeof Member>;

export const AddMemberBody = z.object({ email: Email, role: ProjectRole }).strict();
export type AddMemberBody = z.infer<typeof AddMemberBody>;
export const UpdateMemberBody = z.object({ role: ProjectRole }).strict();
export type UpdateMemberBody = z.infer<typeof UpdateMemberBody>;

export const ProjectParams = z.object({ projectId: z.string().uuid('Not a project id') });
export const MemberParams = ProjectParams.extend({ userId: z.string().uuid('Not a user id') });

export const ProjectListResponse = z.object({ projects: z.array(Project) });
export const ProjectResponse = z.object({ project: Project });
export const ProjectDetailResponse = z.object({ project: Project, members: z.array(Member) });
export const MemberListResponse = z.object({ members: z.array(Member) });
export const MemberResponse = z.object({ member: Member });
