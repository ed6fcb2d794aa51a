import { expect } from 'vitest'
import type { Client } from './http'
import type { LibraryFixture } from './library'
import { savePlan, thinSheetSpec, type SavedPlan } from './plans'
import { booking, createLine } from './schedule'
import { pause } from './poll'

/** The 2 mm water-quenched sheet (handling within seconds) with a 2 s minimum soak, so a test can run the whole floor sequence. */
export async function quickPlan(metallurgist: Client, lib: LibraryFixture, quenchDelayAllowance_s: number): Promise<SavedPlan> {
  const spec = thinSheetSpec(lib)
  return await savePlan(metallurgist, { ...spec, soak: { ...spec.soak!, minimumSoak_s: 2 }, quenchDelayAllowance_s })
}

export interface Released {
  batchId: number
  loadNumber: string
  /** Recorded instants (ms) by state, as GET /api/batches/:id lists them. */
  at: Record<string, number>
}

export async function move(client: Client, batchId: number, to: string) {
  return await client.request(`/api/batches/${batchId}/events`, { method: 'POST', body: { to } })
}

/**
 * Books `plan` now on a fresh line and records charge, core at heat (then waits
 * `soakWait_ms`) and quench as `recorder`, checks that a release straight after the
 * quench is refused, then releases as soon as the clock allows.
 */
export async function releaseLoad(clients: { admin: Client; metallurgist: Client; recorder: Client; reader: Client }, plan: SavedPlan, soakWait_ms: number): Promise<Released> {
  const { admin, metallurgist, recorder, reader } = clients
  const line = await createLine(admin, 'Rec', 'water')
  const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, Date.now() + 1000, 'PO-REC') })
  expect(booked.status).toBe(201)
  const batchId = booked.body.id
  expect((await move(recorder, batchId, 'charged')).status).toBe(201)
  expect((await move(recorder, batchId, 'soaking')).status).toBe(201)
  await pause(soakWait_ms)
  expect((await move(recorder, batchId, 'quenched')).status).toBe(201)
  // Straight after the quench the core is still hot: the release is refused.
  let release = await move(recorder, batchId, 'released')
  expect(release.status).toBe(409)
  const deadline = Date.now() + 20_000
  while (release.status === 409 && Date.now() < deadline) {
    await pause(400)
    release = await move(recorder, batchId, 'released')
  }
  expect(release.status).toBe(201)
  const detail = await reader.request(`/api/batches/${batchId}`)
  const at: Record<string, number> = {}
  for (const event of detail.body.events) at[event.toState] = Date.parse(event.at)
  return { batchId, loadNumber: booked.body.loadNumber, at }
}
