/** A problem with one input, the field a dotted path as zod and the API write it ("gradedProfile.2.x"). */
export interface FormFieldProblem {
  field: string
  message: string
}

export interface FormSubmitOptions {
  /**
   * Rewords a message for its full dotted path, for a form whose input holds a list
   * and can say which entry is wrong. By default the message is shown as it is.
   */
  messageFor?: (path: string, message: string) => string
}

/**
 * The state every edit form keeps: per-input messages (`errors`, keyed by the top-level
 * field the input edits), one headline (`problem`) and `busy` while the request runs.
 * The same schema checks the form before sending and the server after, so both kinds of
 * failure land under the same inputs.
 */
export function useFormSubmit(options: FormSubmitOptions = {}) {
  const errors = ref<Record<string, string>>({})
  const problem = ref('')
  const busy = ref(false)
  const { describe } = useApiError()

  function clear() {
    errors.value = {}
    problem.value = ''
  }

  /** One message per input: the first problem found for a field is the one shown. */
  function showProblems(problems: FormFieldProblem[]) {
    const found: Record<string, string> = {}
    for (const { field: path, message } of problems) {
      // A problem with the whole body (an empty path) has no input of its own.
      const field = path.split('.')[0] || '(body)'
      found[field] ??= options.messageFor ? options.messageFor(path, message) : message
    }
    errors.value = found
  }

  /** A failed client-side parse; `more` adds problems the schema cannot see (e.g. unparsable text). */
  function showIssues(issues: readonly { path: readonly PropertyKey[]; message: string }[], more: FormFieldProblem[] = []) {
    showProblems([...issues.map((issue) => ({ field: issue.path.map(String).join('.'), message: issue.message })), ...more])
  }

  /**
   * Runs the request with `busy` set; a failure shows the server's `data.problems` under
   * the inputs, or its headline when it names no field (a generic "Invalid request body"
   * beside a field's own message only repeats it), then goes to `onFailure`.
   */
  async function send(request: () => Promise<void>, onFailure?: (failure: unknown) => void) {
    busy.value = true
    try {
      await request()
    } catch (failure) {
      const described = describe(failure)
      const fields = Object.keys(described.fields)
      problem.value = fields.length === 0 ? described.message : fields.includes('(body)') ? described.fields['(body)']! : ''
      showProblems(Object.entries(described.fields).map(([field, message]) => ({ field, message })))
      onFailure?.(failure)
    } finally {
      busy.value = false
    }
  }

  return { errors, problem, busy, clear, showIssues, send }
}
