import type { FetchError } from 'ofetch'

export interface ApiProblem {
  message: string
  fields: Record<string, string>
}

/** Turns a failed $fetch into a headline and per-field messages (the API's `data.problems`). */
export function useApiError() {
  function describe(error: unknown): ApiProblem {
    const data = (error as FetchError)?.data as
      | { statusMessage?: string; message?: string; data?: { problems?: { field: string; message: string }[] } }
      | undefined
    const fields: Record<string, string> = {}
    for (const problem of data?.data?.problems ?? []) fields[problem.field] ??= problem.message
    const message = data?.statusMessage || data?.message || 'Something went wrong. Nothing was saved.'
    return { message, fields }
  }
  return { describe }
}
