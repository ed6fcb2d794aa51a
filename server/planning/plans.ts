import { and, desc, eq, inArray, sql } from 'drizzle-orm'
import { createError } from 'h3'
import { z } from 'zod'
import type { Database, Transaction } from '../db/client'
import { materials, planRevisions, plans, quenchants, users } from '../db/schema'
import { CaseError } from '../thermal/errors'
import { planEngine } from './planEngine'
import { JobPoolClosedError, JobQueueFullError, JobTimeoutError } from '../workers/jobPool'
import { PART_SHAPES, resolvedPlanSchema, type PlanSpec, type ResolvedPlan } from '../../shared/schemas/plan'
import type { PlanSummary } from '../../shared/types/plan'
import type { PlanCheckResult, PlanDetail, PlanListItem, PlanResult } from '../../shared/types/planResult'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { positiveId } from '../utils/validation'

const planId = positiveId('Plan')
/** Path parameters of the /api/plans/[id] routes. */
export const PlanIdParams = z.object({ id: planId })
export const PlanRevisionParams = z.object({ id: planId, revision: z.coerce.number({ message: 'Revision must be a number' }).int().positive('Revision must be positive') })

function badReference(field: string, message: string): never {
  throw createError({ statusCode: 400, statusMessage: 'Invalid request body', message: `${field}: ${message}`, data: { problems: [{ field, message }] } })
}

/** Copies the current library values the spec refers to into it (what a revision stores). */
export async function resolvePlan(spec: PlanSpec, db: Database | Transaction = useDb()): Promise<ResolvedPlan> {
  const [material] = await db.select().from(materials).where(eq(materials.id, spec.materialId))
  if (!material) badReference('materialId', `No material with id ${spec.materialId} in the library`)
  const ids = [...new Set(spec.stages.map((s) => s.quenchantId))]
  const rows = await db.select().from(quenchants).where(inArray(quenchants.id, ids))
  spec.stages.forEach((s, i) => {
    if (!rows.some((q) => q.id === s.quenchantId)) badReference(`stages.${i}.quenchantId`, `No quenchant with id ${s.quenchantId} in the library`)
  })
  return {
    ...spec,
    library: {
      material: {
        id: material.id,
        name: material.name,
        k_W_mK: material.k_W_mK,
        density_kg_m3: material.density_kg_m3,
        specificHeat_J_kgK: material.specificHeat_J_kgK,
        gradedProfile: material.gradedProfile ?? null,
        propertyTable: material.propertyTable ?? null,
        propertyTableSource: material.propertyTableSource ?? null,
        source: material.source,
      },
      quenchants: rows.map((q) => ({
        id: q.id,
        name: q.name,
        kind: q.kind,
        hLow_W_m2K: q.hLow_W_m2K,
        hTypical_W_m2K: q.hTypical_W_m2K,
        hHigh_W_m2K: q.hHigh_W_m2K,
        bath_C: q.bath_C,
        coolingCurves: q.coolingCurves ?? null,
        emissivity: q.emissivity ?? null,
        curveSource: q.curveSource ?? null,
        source: q.source,
      })),
    },
  }
}

/** What the cap refusal tells the planner to change. */
const COARSEN_HINT = 'coarsen the plan: fewer graded-profile points in the material, fewer quench stages, or a handling temperature further above the bath'

/**
 * Engine refusals (CaseError, EngineLimitError: the engine's own budget) are 422 naming
 * the plan field; a job over the engine's
 * time cap is 422 naming the cap; a full queue or a stopping server is 503. Anything else is a real failure.
 */
async function engine<T>(run: () => Promise<T>): Promise<T> {
  try {
    return await run()
  } catch (error) {
    if (error instanceof CaseError) {
      const message = error.reason
      throw createError({
        statusCode: 422,
        statusMessage: 'This plan cannot be computed',
        message: `${error.field}: ${message}`,
        data: { problems: [{ field: error.field, message }] },
      })
    }
    if (error instanceof JobTimeoutError) {
      const message = `this case needs more than ${error.limit_s} s of engine time; ${COARSEN_HINT}`
      throw createError({ statusCode: 422, statusMessage: 'This plan takes too long to compute', message: `plan: ${message}`, data: { problems: [{ field: 'plan', message }] } })
    }
    if (error instanceof JobQueueFullError) {
      throw createError({ statusCode: 503, statusMessage: 'The engine is busy', message: 'Too many computations are waiting; try again in a few seconds.' })
    }
    if (error instanceof JobPoolClosedError) {
      throw createError({ statusCode: 503, statusMessage: 'The server is restarting', message: 'This computation was stopped by a restart; try again in a few seconds.' })
    }
    throw error
  }
}

export const computeResolved = (plan: ResolvedPlan): Promise<PlanResult> => engine(() => planEngine().compute(plan))
export const checkResolved = (plan: ResolvedPlan): Promise<PlanCheckResult> => engine(() => planEngine().check(plan))

/** The preview as JSON text (a PlanResult), serialised where it was computed. */
export async function previewPlanJson(spec: PlanSpec): Promise<string> {
  const plan = await resolvePlan(spec)
  return await engine(() => planEngine().computeJson(plan))
}

export async function checkSpec(spec: PlanSpec): Promise<PlanCheckResult> {
  return await checkResolved(await resolvePlan(spec))
}

function storedPlan(spec: unknown): ResolvedPlan {
  return resolvedPlanSchema.parse(spec)
}

export interface PlanListQuery {
  /** Part of the plan's name or its material's, any case. */
  q?: string
  shape?: PlanListItem['shape']
  /** Archived plans instead of the active ones. */
  archived: boolean
}

export async function listPlans(query: PlanListQuery = { archived: false }): Promise<PlanListItem[]> {
  // Only the few fields the list shows, read in the database: a temperature-dependent
  // revision's spec and summary carry tables, curves and histories of tens of kB each.
  const text = (json: typeof planRevisions.spec, path: string) => sql<string | null>`JSON_VALUE(${json}, ${path})`
  const number = (json: typeof planRevisions.summary, path: string) => sql<number | null>`CAST(JSON_VALUE(${json}, ${path}) AS DOUBLE)`
  const rows = await useDb()
    .select({
      plan: plans,
      shape: text(planRevisions.spec, '$.part.shape'),
      materialName: text(planRevisions.spec, '$.library.material.name'),
      quenchToHandling_s: number(planRevisions.summary, '$.quenchToHandling_s'),
      soakTotal_s: number(planRevisions.summary, '$.soak.total_s'),
      handling_C: number(planRevisions.summary, '$.handling_C'),
    })
    .from(plans)
    .innerJoin(planRevisions, and(eq(planRevisions.planId, plans.id), eq(planRevisions.revision, plans.latestRevision)))
    .where(eq(plans.archived, query.archived))
    .orderBy(desc(plans.updatedAt))
  const wanted = query.q?.trim().toLowerCase() ?? ''
  const items = rows.map(({ plan, shape, materialName, quenchToHandling_s, soakTotal_s, handling_C }): PlanListItem => ({
    id: plan.id,
    name: plan.name,
    latestRevision: plan.latestRevision,
    shape: PART_SHAPES.includes(shape as never) ? (shape as PlanListItem['shape']) : 'plate',
    materialName: materialName ?? '',
    quenchToHandling_s,
    soakTotal_s,
    handling_C,
    updatedAt: plan.updatedAt.toISOString(),
    archived: plan.archived,
  }))
  return items.filter((item) => (!query.shape || item.shape === query.shape) && (!wanted || `${item.name}\n${item.materialName}`.toLowerCase().includes(wanted)))
}

/**
 * Archives a plan (out of the list and the booking form) or brings it back. Its
 * revisions stay as they are: loads booked on them, their records and links still read them.
 */
export async function setPlanArchived(id: number, archived: boolean, actorId: number): Promise<{ id: number; archived: boolean }> {
  await useDb().transaction(async (tx) => {
    const [plan] = await tx.select({ id: plans.id, name: plans.name }).from(plans).where(eq(plans.id, id)).for('update')
    if (!plan) throw createError({ statusCode: 404, statusMessage: 'Plan not found' })
    await tx.update(plans).set({ archived }).where(eq(plans.id, id))
    await recordAudit(tx, { actorId, action: archived ? 'plan.archive' : 'plan.restore', entityType: 'plan', entityId: id, details: { name: plan.name } })
  })
  return { id, archived }
}

/** `result` is computed before the transaction opens: a solve never holds row locks or a connection. */
async function insertRevision(tx: Transaction, planId: number, revision: number, plan: ResolvedPlan, result: PlanResult, note: string | null, actorId: number) {
  await tx.insert(planRevisions).values({
    planId,
    revision,
    spec: plan as unknown as Record<string, unknown>,
    summary: result.summary as unknown as Record<string, unknown>,
    note,
    createdBy: actorId,
  })
}

/** What POST /api/plans does; the demo seed calls it too (with the script's database), so demo plans are ordinary plans. */
export async function createPlan(spec: PlanSpec, actorId: number, note: string | null = null, db: Database = useDb()): Promise<PlanDetail> {
  const resolved = await resolvePlan(spec, db)
  return await createFromResolved(resolved, actorId, note, 'plan.create', {}, db)
}

async function createFromResolved(
  resolved: ResolvedPlan,
  actorId: number,
  note: string | null,
  action: string,
  details: Record<string, unknown> = {},
  db: Database = useDb(),
): Promise<PlanDetail> {
  const result = await computeResolved(resolved)
  const id = await db.transaction(async (tx) => {
    const [{ id }] = await tx.insert(plans).values({ name: resolved.name, latestRevision: 1, createdBy: actorId }).$returningId()
    await insertRevision(tx, id, 1, resolved, result, note, actorId)
    await recordAudit(tx, {
      actorId,
      action,
      entityType: 'plan',
      entityId: id,
      details: { name: resolved.name, revision: 1, quenchToHandling_s: result.summary.quenchToHandling_s, ...details },
    })
    return id
  })
  // The result was just computed for the revision; reading the plan back need not compute it again.
  return { ...(await readPlan(id, 1, db)), result }
}

/** An edit is a new revision; earlier revisions are never touched. */
export async function addRevision(id: number, spec: PlanSpec, note: string | null, actorId: number): Promise<PlanDetail> {
  const resolved = await resolvePlan(spec)
  const result = await computeResolved(resolved)
  const revision = await useDb().transaction(async (tx) => {
    const [plan] = await tx.select().from(plans).where(eq(plans.id, id)).for('update')
    if (!plan) throw createError({ statusCode: 404, statusMessage: 'Plan not found' })
    const revision = plan.latestRevision + 1
    await insertRevision(tx, id, revision, resolved, result, note, actorId)
    await tx.update(plans).set({ name: resolved.name, latestRevision: revision }).where(eq(plans.id, id))
    await recordAudit(tx, {
      actorId,
      action: 'plan.revise',
      entityType: 'plan',
      entityId: id,
      details: { revision, name: resolved.name, quenchToHandling_s: result.summary.quenchToHandling_s, from: plan.latestRevision },
    })
    return revision
  })
  return { ...(await readPlan(id, revision)), result }
}

/** A copy from the latest revision's stored values (not today's library), so it computes the same. */
export async function duplicatePlan(id: number, actorId: number): Promise<PlanDetail> {
  const source = await readPlan(id)
  const name = `Copy of ${source.name}`.slice(0, 160)
  return await createFromResolved({ ...source.spec, name }, actorId, `Duplicated from plan ${id} revision ${source.revision}`, 'plan.duplicate', {
    sourcePlanId: id,
    sourceRevision: source.revision,
  })
}

/** The given revision (default: latest) with its freshly computed result and the revision list. */
export async function getPlan(id: number, revision?: number, db: Database = useDb()): Promise<PlanDetail> {
  const plan = await readPlan(id, revision, db)
  return { ...plan, result: await computeResolved(plan.spec) }
}

/** The given revision (default: latest) and the revision list, without computing the result. */
async function readPlan(id: number, revision?: number, db: Database = useDb()): Promise<Omit<PlanDetail, 'result'>> {
  const [plan] = await db.select().from(plans).where(eq(plans.id, id))
  if (!plan) throw createError({ statusCode: 404, statusMessage: 'Plan not found' })
  const revisions = await db
    .select({
      id: planRevisions.id,
      revision: planRevisions.revision,
      note: planRevisions.note,
      createdAt: planRevisions.createdAt,
      summary: planRevisions.summary,
      spec: planRevisions.spec,
      createdBy: users.displayName,
    })
    .from(planRevisions)
    .leftJoin(users, eq(users.id, planRevisions.createdBy))
    .where(eq(planRevisions.planId, id))
    .orderBy(desc(planRevisions.revision))
  const wanted = revision ?? plan.latestRevision
  const row = revisions.find((r) => r.revision === wanted)
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Revision not found' })
  const spec = storedPlan(row.spec)
  return {
    id: plan.id,
    name: plan.name,
    latestRevision: plan.latestRevision,
    revision: row.revision,
    planRevisionId: row.id,
    note: row.note,
    spec,
    revisions: revisions.map((r) => ({
      revision: r.revision,
      note: r.note,
      createdAt: r.createdAt.toISOString(),
      createdBy: r.createdBy,
      quenchToHandling_s: (r.summary as PlanSummary | null)?.quenchToHandling_s ?? null,
    })),
  }
}

/** Materials and quenchants the editor may choose from (the planner's view of the library). */
export async function planLibraryOptions() {
  const db = useDb()
  const [materialRows, quenchantRows] = await Promise.all([
    db
      .select({
        id: materials.id,
        name: materials.name,
        k_W_mK: materials.k_W_mK,
        density_kg_m3: materials.density_kg_m3,
        specificHeat_J_kgK: materials.specificHeat_J_kgK,
        gradedProfile: materials.gradedProfile,
        propertyTable: materials.propertyTable,
      })
      .from(materials)
      .orderBy(materials.name),
    db
      .select({
        id: quenchants.id,
        name: quenchants.name,
        kind: quenchants.kind,
        hLow_W_m2K: quenchants.hLow_W_m2K,
        hTypical_W_m2K: quenchants.hTypical_W_m2K,
        hHigh_W_m2K: quenchants.hHigh_W_m2K,
        bath_C: quenchants.bath_C,
        coolingCurves: quenchants.coolingCurves,
      })
      .from(quenchants)
      .orderBy(quenchants.name),
  ])
  return {
    materials: materialRows.map(({ gradedProfile, propertyTable, ...m }) => ({ ...m, graded: !!gradedProfile, hasTable: !!propertyTable })),
    quenchants: quenchantRows.map(({ coolingCurves, ...q }) => ({ ...q, hasCurves: !!coolingCurves })),
  }
}
