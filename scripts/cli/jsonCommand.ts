/**
 * The shell shared by the JSON command lines (cooldown, calibrate): read the one file
 * argument as JSON, print the answer as JSON on stdout, and turn an input error into
 * "field: message" on stderr with exit code 2. Anything else is a bug and still throws.
 */
import { readFileSync } from 'node:fs'

export interface JsonCommand {
  /** The usage line printed when the file argument is missing. */
  usage: string
  /** Computes the answer; `flags` are the arguments that start with "--". */
  run: (input: unknown, flags: string[]) => unknown
  /** The errors whose message is already "field: message" for the user. */
  isInputError: (error: unknown) => boolean
}

export function runJsonCommand({ usage, run, isInputError }: JsonCommand, args = process.argv.slice(2)) {
  const file = args.find((a) => !a.startsWith('--'))
  if (!file) return refuse(`usage: ${usage}`)
  let input: unknown
  try {
    input = JSON.parse(readFileSync(file, 'utf8'))
  } catch (error) {
    return refuse(`${file}: ${(error as Error).message}`)
  }
  try {
    process.stdout.write(`${JSON.stringify(run(input, args.filter((a) => a.startsWith('--'))), null, 2)}\n`)
  } catch (error) {
    if (isInputError(error)) return refuse((error as Error).message)
    throw error
  }
}

function refuse(message: string): never {
  process.stderr.write(`${message}\n`)
  process.exit(2)
}
