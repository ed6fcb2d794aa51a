export const pause = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms))

/**
 * Reads every 100 ms until `ok` holds and returns that value; after `seconds` it throws
 * "`what` within N s" with the last value read.
 */
export async function until<T>(read: () => Promise<T>, ok: (value: T) => boolean, seconds = 20, what = 'condition not met'): Promise<T> {
  const deadline = Date.now() + seconds * 1000
  let value = await read()
  while (!ok(value)) {
    if (Date.now() > deadline) throw new Error(`${what} within ${seconds} s; last value: ${JSON.stringify(value).slice(0, 600)}`)
    await pause(100)
    value = await read()
  }
  return value
}
