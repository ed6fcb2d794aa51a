/**
 * A saved plan's part as the calibration probe: its shape, size and material as the
 * revision's snapshot holds them (so the probe is the part the plan was computed for,
 * whatever the library says today), with the thermocouple at the centre, at the
 * surface or at a depth below the surface. The fit models one-dimensional bodies, so
 * short cylinders and blocks are refused.
 */
import { and, eq } from 'drizzle-orm'
import { createError } from 'h3'
import { planRevisions, plans } from '../db/schema'
import { useDb } from '../utils/db'
import { engineBody } from '../planning/shapes'
import { engineMaterial } from '../planning/quenchPhysics'
import { PART_SHAPE_LABELS, resolvedPlanSchema, type Part } from '../../shared/schemas/plan'
import type { PlanProbe } from '../../shared/schemas/calibration'
import type { CalibrationProbe } from '../../shared/types/calibration'
import type { CaseInput } from '../thermal/caseSchema'

export interface ProbeBody {
  description: CalibrationProbe
  material: CaseInput['material']
}

function unprocessable(field: string, message: string): never {
  throw createError({ statusCode: 422, statusMessage: 'Calibration refused', message: `${field}: ${message}`, data: { problems: [{ field, message }] } })
}

const mm = (m: number) => `${Number((m * 1000).toPrecision(4))} mm`

function partInWords(part: Part): string {
  if (part.shape === 'plate') return `${PART_SHAPE_LABELS.plate} ${mm(part.thickness_m)} thick`
  if (part.shape === 'round-bar' || part.shape === 'sphere') return `${PART_SHAPE_LABELS[part.shape]} Ø${mm(part.diameter_m)}`
  return PART_SHAPE_LABELS[part.shape]
}

/** Thermocouple position as a fraction of the half-thickness or radius from the centre, checked against the part. */
function thermocoupleX(thermocouple: PlanProbe['thermocouple'], size_m: number): number {
  if (thermocouple === 'centre') return 0
  if (thermocouple === 'surface') return 1
  if (thermocouple.depth_m > size_m)
    unprocessable('probe.thermocouple.depth_m', `the part's centre is ${mm(size_m)} below its surface; the thermocouple cannot be deeper`)
  return 1 - thermocouple.depth_m / size_m
}

function thermocoupleInWords(thermocouple: PlanProbe['thermocouple']): string {
  if (typeof thermocouple === 'string') return `thermocouple at the ${thermocouple}`
  return `thermocouple ${mm(thermocouple.depth_m)} below the surface`
}

export async function planProbeBody(probe: PlanProbe): Promise<ProbeBody> {
  const [plan] = await useDb().select().from(plans).where(eq(plans.id, probe.planId))
  if (!plan) unprocessable('probe.planId', `no plan with id ${probe.planId}`)
  const revision = probe.revision ?? plan.latestRevision
  const [row] = await useDb()
    .select({ spec: planRevisions.spec })
    .from(planRevisions)
    .where(and(eq(planRevisions.planId, plan.id), eq(planRevisions.revision, revision)))
  if (!row) unprocessable('probe.revision', `plan "${plan.name}" has no revision ${revision}`)
  const spec = resolvedPlanSchema.parse(row.spec)
  const body = engineBody(spec.part)
  if (body.kind !== 'series')
    unprocessable('probe.planId', `a ${PART_SHAPE_LABELS[spec.part.shape].toLowerCase()} cannot be a probe: the fit models plates, round bars and spheres`)
  const m = spec.library.material
  return {
    description: {
      preset: null,
      plan: { id: plan.id, revision, name: plan.name },
      label: `Plan "${plan.name}" revision ${revision}: ${partInWords(spec.part)}, ${m.name}, ${thermocoupleInWords(probe.thermocouple)}`,
      geometry: body.geometry,
      size_m: body.size_m,
      x: thermocoupleX(probe.thermocouple, body.size_m),
    },
    // The snapshot's material as the plan's engine reads it: its graded profile or property table when it has one.
    material: engineMaterial(m, spec.physics),
  }
}
