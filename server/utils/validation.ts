import type { H3Event } from 'h3'
import { z } from 'zod'

export interface FieldProblem {
  field: string
  message: string
}

/** zod issues as `{ field, message }` pairs, the field a dotted path ("stages.1.duration_s"). */
export function fieldProblems(error: z.ZodError): FieldProblem[] {
  return error.issues.map((issue) => ({
    field: issue.path.length ? issue.path.map(String).join('.') : '(body)',
    message: issue.message,
  }))
}

/** A 400 naming every field zod refused; `where` is what was invalid ("request body", "query"…). */
export function invalidRequest(error: z.ZodError, where: string): never {
  const problems = fieldProblems(error)
  const first = problems[0]
  throw createError({
    statusCode: 400,
    statusMessage: `Invalid ${where}`,
    message: first ? `${first.field}: ${first.message}` : `Invalid ${where}`,
    data: { problems },
  })
}

/** Reads and validates a JSON body; malformed JSON is a 400 from h3 itself. */
export async function readValid<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  const body = await readBody(event)
  const parsed = schema.safeParse(body ?? {})
  return parsed.success ? parsed.data : invalidRequest(parsed.error, 'request body')
}

export async function paramsValid<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  const parsed = schema.safeParse(getRouterParams(event))
  return parsed.success ? parsed.data : invalidRequest(parsed.error, 'path parameter')
}

export function queryValid<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  const parsed = schema.safeParse(getQuery(event))
  return parsed.success ? parsed.data : invalidRequest(parsed.error, 'query')
}

/** A positive whole-number id of a `noun` ("Batch", "Plan"…), with messages that name it. */
export function positiveId(noun: string) {
  return z.coerce.number({ message: `${noun} id must be a number` }).int().positive(`${noun} id must be positive`)
}

/** The `[id]` path parameter of a route about one `noun`. */
export function idParams(noun: string) {
  return z.object({ id: positiveId(noun) })
}

/** Validates the text fields of a multipart form (server/utils/upload.ts). */
export function formFieldsValid<S extends z.ZodType>(fields: Record<string, string>, schema: S): z.infer<S> {
  const parsed = schema.safeParse(fields)
  return parsed.success ? parsed.data : invalidRequest(parsed.error, 'form fields')
}
