import type { DataSource, EntityManager } from 'typeorm';
import { asSubject, type AppAbility } from '../../../policies/access';
import type { PlanTemplateDto, PlanTemplateSummaryDto } from '../../../policies/dto';
import { templateLengthDays } from '../../../policies/load/plan-template';
import { accessibleWhere } from '../core/accessible';
import { authorize } from '../core/authorize';
import { orgQuery } from '../core/command';
import { PlanTemplate } from '../entities';
import { memberNames } from './members';

type Db = DataSource | EntityManager;

const manager = (db: Db) => ('manager' in db ? db.manager : db);

export const templateSubject = (t: Pick<PlanTemplate, 'id' | 'organizationId' | 'authorId'>) => ({
  id: t.id,
  organizationId: t.organizationId,
  authorId: t.authorId,
});

/** A template as the reader sees it, with its author's name and whether the reader may change it. */
export async function planTemplateDtos(db: Db, ability: AppAbility, rows: PlanTemplate[]): Promise<PlanTemplateDto[]> {
  const names = await memberNames(db, [...new Set(rows.map((t) => t.authorId))]);
  return rows.map((t) => ({
    id: t.id,
    name: t.name,
    description: t.description,
    authorId: t.authorId,
    authorName: names.get(t.authorId) ?? 'A former member',
    stageCount: t.stages.length,
    lengthDays: templateLengthDays(t.stages),
    canEdit: !t.archived && ability.can('update', asSubject('PlanTemplate', templateSubject(t))),
    updatedAt: new Date(t.updatedAt).toISOString(),
    version: t.version,
    stages: t.stages,
    guidance: t.guidance,
  }));
}

/** Loads a template of the reader's organization they may read (404 otherwise, archived ones included). */
export async function readableTemplate(db: Db, ability: AppAbility, organizationId: string, id: string): Promise<PlanTemplate> {
  const t = await manager(db).findOne(PlanTemplate, { where: { id, organizationId } });
  authorize(ability, 'read', 'PlanTemplate', t);
  return t;
}

/** The organization's templates in use, by name; the stages are left out of the list. */
export const listPlanTemplates = orgQuery({
  name: 'planTemplates.list',
  async run(ctx, _input: void): Promise<PlanTemplateSummaryDto[]> {
    const acl = accessibleWhere(ctx.ability, 'read', 'PlanTemplate', { organizationId: 't.organization_id', authorId: 't.author_id' });
    const rows = await manager(ctx.db)
      .createQueryBuilder(PlanTemplate, 't')
      .where('t.organization_id = :org AND NOT t.archived', { org: ctx.actor.organizationId })
      .andWhere(acl.sql, acl.params)
      .orderBy('lower(t.name)', 'ASC')
      .limit(500)
      .getMany();
    return (await planTemplateDtos(ctx.db, ctx.ability, rows)).map(({ stages: _s, guidance: _g, ...summary }) => summary);
  },
});

export const planTemplateQuery = orgQuery({
  name: 'planTemplates.get',
  async run(ctx, input: { id: string }): Promise<PlanTemplateDto> {
    const t = await readableTemplate(ctx.db, ctx.ability, ctx.actor.organizationId, input.id);
    return (await planTemplateDtos(ctx.db, ctx.ability, [t]))[0];
  },
});
