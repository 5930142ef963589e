import { ServiceError, conflict, forbidden, notFound, staleVersion } from './errors';
import { membersRepo, projectsRepo, toProject, type ProjectRow } from '../repositories/projects';
import { usersRepo } from '../repositories/users';
import { auditRepo } from '../repositories/audit';
import type { Actor, ServiceContext } from './context';
import { reviewLoopService } from './reviewLoop';
import { systemsService } from './systems';
import type { AddMemberBody, CreateProjectBody, Member, Project, ProjectRole, UpdateProjectBody } from '../../src/shared/api/projects';

export const canCreateProjects = (actor: Actor) => actor.isAdmin || actor.accountRole === 'designer';

export const projectsService = {
  async list(ctx: ServiceContext, actor: Actor): Promise<Project[]> {
    const rows = actor.isAdmin ? await projectsRepo.listAll(ctx.db, actor.id) : await projectsRepo.listForUser(ctx.db, actor.id);
    // the "returned" marker is design information: members only (an administrator who is not a member sees none)
    const returned = await reviewLoopService.returnedCounts(
      ctx.db,
      rows.filter((r) => r.role).map((r) => r.id),
    );
    return rows.map((r) => ({ ...toProject(r, r.role), ...(r.role ? { returnedSystems: returned.get(r.id) ?? 0 } : {}) }));
  },

  async create(ctx: ServiceContext, actor: Actor, body: Required<CreateProjectBody>): Promise<Project> {
    if (!canCreateProjects(actor)) throw forbidden('Only designers and administrators create projects.');
    return ctx.db.transaction(async (trx) => {
      const row = await projectsRepo.insert(trx, {
        name: body.name,
        address: body.address,
        code_basis: body.codeBasis,
        unit_system: body.unitSystem,
        notes: body.notes,
        ...(body.permit ? { permit: JSON.stringify(body.permit) } : {}),
        created_by: actor.id,
      });
      await membersRepo.insert(trx, row.id, actor.id, 'designer');
      await auditRepo.record(trx, { actorId: actor.id, projectId: row.id, action: 'project.created', subjectType: 'project', subjectId: row.id });
      return toProject(row, 'designer');
    });
  },

  async get(ctx: ServiceContext, projectId: string, myRole: ProjectRole | null): Promise<{ project: Project; members: Member[] }> {
    const row = await projectsRepo.findById(ctx.db, projectId);
    if (!row) throw notFound('The project');
    const returned = myRole ? await reviewLoopService.returnedCounts(ctx.db, [projectId]) : null;
    return {
      project: { ...toProject(row, myRole), ...(returned ? { returnedSystems: returned.get(projectId) ?? 0 } : {}) },
      members: await membersRepo.list(ctx.db, projectId),
    };
  },

  async update(ctx: ServiceContext, actor: Actor, projectId: string, body: UpdateProjectBody): Promise<Project> {
    return ctx.db.transaction(async (trx) => {
      const values: Partial<Omit<ProjectRow, 'permit'>> & { permit?: string } = {};
      if (body.name !== undefined) values.name = body.name;
      if (body.address !== undefined) values.address = body.address;
      if (body.codeBasis !== undefined) values.code_basis = body.codeBasis;
      if (body.unitSystem !== undefined) values.unit_system = body.unitSystem;
      if (body.notes !== undefined) values.notes = body.notes;
      if (body.permit !== undefined) values.permit = JSON.stringify(body.permit);
      if (body.archived !== undefined) values.archived = body.archived;
      const before = await projectsRepo.findById(trx, projectId);
      const row = await projectsRepo.update(trx, projectId, body.version, values);
      if (!row) {
        if (!before) throw notFound('The project');
        throw staleVersion();
      }
      const { version: _v, ...changed } = body;
      await auditRepo.record(trx, { actorId: actor.id, projectId, action: 'project.updated', subjectType: 'project', subjectId: projectId, details: changed });
      // switching the unit system converts every draft in the same transaction: a draft is never in other units than its project
      if (body.unitSystem !== undefined && before && before.unit_system !== body.unitSystem)
        await systemsService.convertDrafts(trx, actor, projectId, body.unitSystem);
      return toProject(row, 'designer');
    });
  },
};

const lastDesigner = () => new ServiceError('LAST_DESIGNER', 'A project needs at least one designer. Add another designer first.');

export const membersService = {
  list: (ctx: ServiceContext, projectId: string) => membersRepo.list(ctx.db, projectId),

  async add(ctx: ServiceContext, actor: Actor, projectId: string, body: AddMemberBody): Promise<Member> {
    return ctx.db.transaction(async (trx) => {
      const user = await usersRepo.findByEmail(trx, body.email);
      if (!user || user.status === 'disabled') {
        throw new ServiceError('USER_NOT_FOUND', 'No active account has this e-mail. Ask an administrator to invite the person first.', {
          email: 'No account with this e-mail',
        });
      }
      if (!(await membersRepo.insert(trx, projectId, user.id, body.role))) {
        throw conflict(`${user.name} is already a member of this project.`, { email: 'Already a member' });
      }
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'member.added',
        subjectType: 'user',
        subjectId: user.id,
        details: { role: body.role },
      });
      return (await membersRepo.find(trx, projectId, user.id))!;
    });
  },

  async setRole(ctx: ServiceContext, actor: Actor, projectId: string, userId: string, role: ProjectRole): Promise<Member> {
    return ctx.db.transaction(async (trx) => {
      const member = await membersRepo.find(trx, projectId, userId);
      if (!member) throw notFound('The member');
      const designers = await membersRepo.designerIdsForUpdate(trx, projectId);
      if (member.role === 'designer' && role !== 'designer' && designers.length === 1) throw lastDesigner();
      await membersRepo.setRole(trx, projectId, userId, role);
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'member.role-changed',
        subjectType: 'user',
        subjectId: userId,
        details: { from: member.role, to: role },
      });
      return (await membersRepo.find(trx, projectId, userId))!;
    });
  },

  async remove(ctx: ServiceContext, actor: Actor, projectId: string, userId: string): Promise<void> {
    await ctx.db.transaction(async (trx) => {
      const member = await membersRepo.find(trx, projectId, userId);
      if (!member) throw notFound('The member');
      const designers = await membersRepo.designerIdsForUpdate(trx, projectId);
      if (member.role === 'designer' && designers.length === 1) throw lastDesigner();
      await membersRepo.remove(trx, projectId, userId);
      await auditRepo.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'member.removed',
        subjectType: 'user',
        subjectId: userId,
        details: { role: member.role },
      });
    });
  },
};
