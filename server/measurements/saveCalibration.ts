/**
 * "Save as the medium's curve": the server fits the request itself on the fit's worker
 * thread (a curve posted by a browser is never trusted), refuses what saveRules.ts
 * refuses, and then, in one transaction, writes the provenance row
 * (quenchant_calibrations), the medium's new band (calibratedBand.ts) with a curve
 * source that names it, and the audit rows. Plans computed afterwards copy the new
 * values into their revision's snapshot; revisions saved before keep what they copied.
 */
import { desc, eq } from 'drizzle-orm'
import { createError } from 'h3'
import { measurementLogs, quenchantCalibrations, quenchants, users } from '../db/schema'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { fieldProblems } from '../utils/validation'
import { fitOnce } from '../workers/fitRunner'
import { QUENCHANT_FIELDS, updateQuenchantWithin } from '../library/quenchants'
import { quenchantInputSchema, RADIATING_KINDS, type QuenchantValues } from '../../shared/schemas/quenchant'
import type { CalibrationSave } from '../../shared/schemas/calibration'
import type { CalibrationResult, QuenchantCalibration } from '../../shared/types/calibration'
import type { SessionUser } from '../utils/auth'
import { calibrationInput, type CalibrationInput } from './calibration'
import { calibratedBand } from './calibratedBand'
import { saveProblems, type SaveProblem } from './saveRules'

function refused(problems: SaveProblem[]): never {
  const first = problems[0]!
  throw createError({ statusCode: 422, statusMessage: 'Calibration not saved', message: `${first.field}: ${first.message}`, data: { problems } })
}

async function serverFit(input: CalibrationInput['input']): Promise<CalibrationResult> {
  const end = await fitOnce(input)
  if ('result' in end) return end.result
  if ('refused' in end) refused([{ field: end.refused.field, message: end.refused.message.slice(end.refused.field.length + 2) }])
  throw createError({ statusCode: 503, statusMessage: 'The fit could not finish', message: end.failed.message })
}

const fmt = (value: number, digits: number) => value.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits })

interface CurveSourceFacts {
  id: number
  fileName: string
  request: CalibrationSave
  fitted: CalibrationInput
  fit: CalibrationResult
  by: string
  radiationDropped: boolean
}

function curveSourceText(c: CurveSourceFacts): string {
  const day = new Date().toISOString().slice(0, 10)
  const text =
    `Calibrated in Slakewise (calibration ${c.id}) from log "${c.fileName}", channel "${c.request.channel}", ` +
    `${c.fitted.probe.label}, bath ${fmt(c.request.bath_C, 1)} °C, by ${c.by} on ${day}: ` +
    `${c.fit.model === 'constant' ? 'one constant h' : `a curve at ${c.fit.hCurve!.length} knots`}, rms ${fmt(c.fit.rms_K, 2)} K over ${c.fit.points} points.` +
    (c.radiationDropped ? ' The fitted h includes the radiation the probe lost, so no emissivity is added on top.' : '')
  return text.slice(0, 1000)
}

export async function saveCalibration(request: CalibrationSave, user: SessionUser): Promise<QuenchantCalibration> {
  const db = useDb()
  const [medium] = await db.select({ id: quenchants.id }).from(quenchants).where(eq(quenchants.id, request.quenchantId))
  if (!medium) refused([{ field: 'quenchantId', message: `no quench medium with id ${request.quenchantId} in the library` }])
  const fitted = await calibrationInput(request)
  const fit = await serverFit(fitted.input)
  const problems = saveProblems(fit, request.acceptUndeterminedKnots)
  if (problems.length) refused(problems)
  const [log] = await db.select({ fileName: measurementLogs.fileName }).from(measurementLogs).where(eq(measurementLogs.id, request.logId))

  const id = await db.transaction(async (tx) => {
    const [current] = await tx.select().from(quenchants).where(eq(quenchants.id, request.quenchantId)).for('update')
    const band = calibratedBand(current!, fit)
    const radiationDropped = current!.emissivity !== null && RADIATING_KINDS.includes(current!.kind)
    const [inserted] = await tx
      .insert(quenchantCalibrations)
      .values({
        quenchantId: request.quenchantId,
        logId: request.logId,
        channel: request.channel,
        probe: fitted.probe,
        bath_C: request.bath_C,
        initial_C: fitted.initial_C,
        from_s: fitted.window.from_s,
        to_s: fitted.window.to_s,
        model: fit.model,
        fitted: fit.h ? { h: fit.h } : { hCurve: fit.hCurve },
        rms_K: fit.rms_K,
        maxAbs_K: fit.maxAbs_K,
        points: fit.points,
        iterations: fit.iterations,
        curves: band.coolingCurves,
        createdBy: user.id,
      })
      .$returningId()
    const calibrationId = inserted!.id
    const patch: Partial<QuenchantValues> = {
      ...band,
      bath_C: request.bath_C,
      emissivity: radiationDropped ? null : current!.emissivity,
      curveSource: curveSourceText({ id: calibrationId, fileName: log!.fileName, request, fitted, fit, by: user.displayName, radiationDropped }),
    }
    // A fitted knot outside the library's ranges would fail the medium's own rules: refuse naming it, write nothing.
    const values = Object.fromEntries(QUENCHANT_FIELDS.map((key) => [key, current![key]]))
    const checked = quenchantInputSchema.safeParse({ ...values, ...patch })
    if (!checked.success) refused(fieldProblems(checked.error))
    await updateQuenchantWithin(tx, request.quenchantId, patch, user.id)
    await recordAudit(tx, {
      actorId: user.id,
      action: 'quenchant.calibrate',
      entityType: 'quenchant',
      entityId: request.quenchantId,
      details: {
        calibration: calibrationId,
        log: request.logId,
        channel: request.channel,
        probe: fitted.probe.label,
        model: fit.model,
        rms_K: fit.rms_K,
        points: fit.points,
      },
    })
    return calibrationId
  })
  return (await listCalibrations(id))[0]!
}

/** Saved calibrations, newest first; one when `id` is given. */
export async function listCalibrations(id?: number): Promise<QuenchantCalibration[]> {
  const rows = await useDb()
    .select({ c: quenchantCalibrations, quenchantName: quenchants.name, logFileName: measurementLogs.fileName, createdBy: users.displayName })
    .from(quenchantCalibrations)
    .innerJoin(quenchants, eq(quenchants.id, quenchantCalibrations.quenchantId))
    .innerJoin(measurementLogs, eq(measurementLogs.id, quenchantCalibrations.logId))
    .leftJoin(users, eq(users.id, quenchantCalibrations.createdBy))
    .where(id === undefined ? undefined : eq(quenchantCalibrations.id, id))
    .orderBy(desc(quenchantCalibrations.createdAt), desc(quenchantCalibrations.id))
  return rows.map(({ c, quenchantName, logFileName, createdBy }) => ({
    id: c.id,
    quenchantId: c.quenchantId,
    quenchantName,
    logId: c.logId,
    logFileName,
    channel: c.channel,
    probe: c.probe,
    bath_C: c.bath_C,
    initial_C: c.initial_C,
    window: { from_s: c.from_s, to_s: c.to_s },
    model: c.model,
    fitted: c.fitted,
    rms_K: c.rms_K,
    maxAbs_K: c.maxAbs_K,
    points: c.points,
    iterations: c.iterations,
    curves: c.curves,
    createdBy,
    createdAt: c.createdAt.toISOString(),
  }))
}
