/**
 * The calibration input (CLI `npm run calibrate` and the calibration API): a body,
 * where its thermocouple sits, the bath, the log and the model of the surface
 * coefficient to fit. Every rejection names the field as a dotted path
 * ("log.T_C.2: not a number") through FitError. The material is any form the
 * cooldown case accepts and is checked by the case schema itself.
 */
import { z } from 'zod'
import { caseToProblem, parseCase } from '../thermal/caseSchema'
import { CaseError } from '../thermal/errors'
import type { CooldownProblem, Geometry } from '../thermal/types'

export class FitError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(`${field}: ${message}`)
    this.name = 'FitError'
  }
}

/** More points than this make a fit slow without telling it more; thin the log first. */
export const MAX_FIT_POINTS = 5000

const number = z.number({ error: 'not a number' })
const positive = number.positive('must be greater than 0')

const thermocouple = z.union([z.enum(['centre', 'surface']), z.object({ x: number.min(0, 'must be between 0 and 1').max(1, 'must be between 0 and 1') }).strict()], {
  error: 'must be "centre", "surface" or { "x": 0–1 }',
})

const model = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('constant') }).strict(),
    z
      .object({ kind: z.literal('curve'), knots_C: z.array(number).min(3, 'a curve needs at least three knots') })
      .strict()
      .superRefine((m, ctx) => {
        for (let i = 1; i < m.knots_C.length; i++)
          if (!(m.knots_C[i] > m.knots_C[i - 1])) ctx.addIssue({ code: 'custom', path: ['knots_C', i], message: 'knots must strictly increase' })
      }),
  ],
  { error: 'kind must be "constant" or "curve"' },
)

const log = z
  .object({ t_s: z.array(number.min(0, 'must be 0 or later')).min(2, 'needs at least two points'), T_C: z.array(number).min(2, 'needs at least two points') })
  .strict()
  .superRefine((l, ctx) => {
    if (l.t_s.length !== l.T_C.length) ctx.addIssue({ code: 'custom', path: ['T_C'], message: `has ${l.T_C.length} values for ${l.t_s.length} times` })
    if (l.t_s.length > MAX_FIT_POINTS) ctx.addIssue({ code: 'custom', path: ['t_s'], message: `more than ${MAX_FIT_POINTS} points; thin the log first` })
    for (let i = 1; i < l.t_s.length; i++)
      if (!(l.t_s[i] > l.t_s[i - 1])) {
        ctx.addIssue({ code: 'custom', path: ['t_s', i], message: 'times must strictly increase' })
        return
      }
  })

export const fitInputSchema = z
  .object({
    geometry: z.enum(['slab', 'rod', 'sphere'], { error: 'must be "slab", "rod" or "sphere"' }),
    size_m: positive,
    material: z.unknown(),
    initial_C: number.optional(),
    ambient_C: number,
    at: thermocouple,
    log,
    model,
  })
  .strict()
  .superRefine((f, ctx) => {
    const parameters = f.model.kind === 'constant' ? 1 : f.model.knots_C.length
    if (f.log.t_s.length < parameters + 2)
      ctx.addIssue({ code: 'custom', path: ['log', 't_s'], message: `needs at least ${parameters + 2} points to fit ${parameters} parameter(s)` })
  })

export type FitInput = z.input<typeof fitInputSchema>
export type FitModel = z.output<typeof model>

/** A validated fit: the body as an engine problem (its surface still to be chosen) and the rest of the input. */
export interface FitCase {
  geometry: Geometry
  problem: CooldownProblem
  /** Thermocouple position as a fraction 0–1 of size_m. */
  x: number
  ambient_C: number
  t_s: number[]
  T_C: number[]
  model: FitModel
}

/** Validates a raw fit input; throws FitError naming the first bad field. */
export function parseFit(input: unknown): FitCase {
  const parsed = fitInputSchema.safeParse(input)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]
    throw new FitError(issue.path.length ? issue.path.join('.') : '(input)', issue.message)
  }
  const f = parsed.data
  if (f.material === undefined) throw new FitError('material', 'required')
  const initial_C = f.initial_C ?? f.log.T_C[0]
  let problem: CooldownProblem
  try {
    // The case schema checks the material; the surface is a placeholder the fit replaces.
    const placeholder = { surface: { h: 1, ambient_C: f.ambient_C } }
    problem = caseToProblem(parseCase({ geometry: f.geometry, size_m: f.size_m, material: f.material, initial_C, stages: [placeholder] }))
  } catch (error) {
    if (error instanceof CaseError) throw new FitError(error.field, error.message.slice(error.field.length + 2))
    throw error
  }
  const x = f.at === 'centre' ? 0 : f.at === 'surface' ? 1 : f.at.x
  return { geometry: f.geometry, problem, x, ambient_C: f.ambient_C, t_s: f.log.t_s, T_C: f.log.T_C, model: f.model }
}
