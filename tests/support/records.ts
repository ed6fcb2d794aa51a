import { expect } from 'vitest'
import type { Client } from './http'
import type { LibraryFixture } from './library'
import { savePlan, thinSheetSpec, type SavedPlan } from './plans'
import { booking, createLine } from './schedule'
import { pause } from './poll'

/**
 * The 2 mm water-quenched sheet (handling within seconds) with a 2 s minimum soak, charged
 * preheated to 600 °C into a furnace at the schema's highest coefficient (2000 W/m²·K), so
 * its predicted heat-up is a few seconds and a test can run the whole floor sequence on time.
 */
export async function quickPlan(metallurgist: Client, lib: LibraryFixture, quenchDelayAllowance_s: number): Promise<SavedPlan> {
  const spec = thinSheetSpec(lib)
  return await savePlan(metallurgist, { ...spec, soak: { ...spec.soak!, minimumSoak_s: 2, charge_C: 600, furnaceH_W_m2K: 2000 }, quenchDelayAllowance_s })
}

export interface Released {
  batchId: number
  loadNumber: string
  /** Recorded instants (ms) by state, as GET /api/batches/:id lists them. */
  at: Record<string, number>
}

export async function move(client: Client, batchId: number, to: string, acknowledgeShortfall?: boolean) {
  return await client.request(`/api/batches/${batchId}/events`, { method: 'POST', body: acknowledgeShortfall === undefined ? { to } : { to, acknowledgeShortfall } })
}

/** A tap that, refused as early (409 with the shortfall), is confirmed a second time. */
async function tapConfirmingShortfall(client: Client, batchId: number, to: string) {
  const first = await move(client, batchId, to)
  if (first.status !== 409 || !first.body.data?.shortfall) return first
  return await move(client, batchId, to, true)
}

export interface FloorRun {
  /** Wait between "out of the furnace" and the quench. */
  transferWait_ms?: number
  /** False: the door opening is not tapped, the quench is recorded straight from soak. */
  door?: boolean
  /** Runs after the quench tap, before the release (a log attached while the load cools). */
  beforeRelease?: (batchId: number) => Promise<void>
}

/**
 * Books `plan` now on a fresh line and records as `recorder`: charge, core at heat once
 * the predicted heat-up has passed, then `soakWait_ms` later the load out of the furnace
 * (confirming the shortfall when that cuts the soak short) and the quench; checks that a
 * release straight after the quench is refused, then releases as soon as the clock allows.
 */
export async function releaseLoad(
  clients: { admin: Client; metallurgist: Client; recorder: Client; reader: Client },
  plan: SavedPlan,
  soakWait_ms: number,
  run: FloorRun = {},
): Promise<Released> {
  const { admin, metallurgist, recorder, reader } = clients
  const line = await createLine(admin, 'Rec', 'water')
  const booked = await metallurgist.request('/api/batches', { method: 'POST', body: booking(plan.planRevisionId, line, Date.now() + 1000, 'PO-REC') })
  expect(booked.status).toBe(201)
  const batchId = booked.body.id
  expect((await move(recorder, batchId, 'charged')).status).toBe(201)
  await pause(Math.ceil((plan.summary.soak?.heatUp_s ?? 0) * 1000) + 50)
  expect((await move(recorder, batchId, 'soaking')).status).toBe(201)
  await pause(soakWait_ms)
  if (run.door !== false) {
    expect((await tapConfirmingShortfall(recorder, batchId, 'unloaded')).status).toBe(201)
    await pause(run.transferWait_ms ?? 0)
    expect((await move(recorder, batchId, 'quenched')).status).toBe(201)
  } else {
    expect((await tapConfirmingShortfall(recorder, batchId, 'quenched')).status).toBe(201)
  }
  await run.beforeRelease?.(batchId)
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
