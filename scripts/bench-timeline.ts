// npm run bench:timeline — the schedule's week view in Debian's Chromium with 2,000 loads,
// side by side with a week of 200. Seeds next week (200) and the week after (2,000) into
// a scratch database on the dev MariaDB (dropped afterwards), serves the built app on it,
// signs in as the demo metallurgist, opens the schedule on this (empty) week and steps
// forward with ▶; for each week it times the draw (click to echarts' "finished", which
// the timeline stamps on data-drawn-at) and the frames while zooming and panning
// (requestAnimationFrame intervals, long tasks). Prints figures and ratios; never fails on time.
import { spawn } from 'node:child_process'
import { chromium, type Page } from 'playwright-core'
import { demoPlanRevisions } from '../server/db/demo/schedule'
import { DEFAULT_SHOP_SETTINGS, slotDurations } from '../shared/schedule'
import { DEMO_USERS } from '../server/db/demo/shop'
import { quantiles } from './bench/quantiles'
import { benchBatch, benchLines, insertBatches, root, scratchDatabase, sh } from './bench/scratchDatabase'

const PORT = Number(process.env.SLAKEWISE_BENCH_APP_PORT ?? 3190)
const BASE_URL = `http://127.0.0.1:${PORT}`
const DAY = 24 * 3600_000
const WEEK = 7 * DAY
const BUSY = 2000
const QUIET = 200
/** One frame at 60 Hz: the budget a frame interval is compared with. */
const FRAME_MS = 1000 / 60

/** Monday 00:00 UTC of the current week: the week the schedule page opens on (the browser runs in UTC). */
const now = Date.now()
const monday = (() => {
  const d = new Date(now)
  d.setUTCHours(0, 0, 0, 0)
  return d.getTime() - ((d.getUTCDay() + 6) % 7) * DAY
})()

/**
 * Runs in the page before its own scripts: records every requestAnimationFrame
 * interval while window.__recording is set, and every long task (> 50 ms). Plain
 * JavaScript text: a function would be passed through tsx's transform, whose helpers
 * do not exist in the page.
 */
const recorderScript = `
  window.__frames = []
  window.__longTasks = []
  window.__recording = false
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) window.__longTasks.push({ start: entry.startTime, duration: entry.duration })
  }).observe({ type: 'longtask', buffered: true })
  let last = 0
  const tick = (t) => {
    if (window.__recording && last > 0) window.__frames.push(t - last)
    last = t
    requestAnimationFrame(tick)
  }
  requestAnimationFrame(tick)
`

const scratch = await scratchDatabase('timeline')
let server: ReturnType<typeof spawn> | undefined
try {
  // The demo pin: one plan, so every load has the same slot lengths and a lane's loads never overlap.
  const plan = (await demoPlanRevisions(scratch.db))[0]!
  const d = slotDurations(plan.summary, DEFAULT_SHOP_SETTINGS)
  const cycle_ms = (d.furnace_s + 20 * 60) * 1000
  const perLane = Math.floor(WEEK / cycle_ms) - 1
  const lines = await benchLines(scratch.db, Math.ceil(BUSY / perLane))
  const week = (from: number, count: number, first: number) =>
    Array.from({ length: count }, (_, i) =>
      benchBatch(first + i, plan, lines[i % lines.length]!, from + Math.floor(i / lines.length) * cycle_ms + (i % 7) * 60_000))
  await insertBatches(scratch.db, [...week(monday + WEEK, QUIET, 1), ...week(monday + 2 * WEEK, BUSY, QUIET + 1)])
  console.log(`[bench] seeded ${QUIET} loads next week and ${BUSY} the week after on ${lines.length} furnaces, each with its own tank (scratch database ${scratch.name})`)

  sh(['-c', 'source scripts/lib.sh && mkdir -p .data && build_if_stale'])
  server = spawn('node', ['.output/server/index.mjs'], {
    cwd: root,
    stdio: ['ignore', 'ignore', 'inherit'],
    env: {
      ...process.env,
      DATABASE_URL: scratch.url,
      PORT: String(PORT),
      NITRO_HOST: '127.0.0.1',
      AUTH_ORIGIN: `${BASE_URL}/api/auth`,
      NUXT_AUTH_SECRET: 'slakewise-bench-secret-not-for-production',
      NUXT_RECORD_SEAL_KEY: 'slakewise-bench-record-seal-key-not-for-production',
      OUTBOX_WORKER: 'off',
      NODE_ENV: 'production',
    },
  })
  sh(['-c', `source scripts/lib.sh && wait_for_url ${BASE_URL}/api/health`])

  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-dev-shm-usage'],
  })
  try {
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, baseURL: BASE_URL, timezoneId: 'UTC' })
    const page = await context.newPage()
    const metallurgist = DEMO_USERS.find((u) => u.role === 'metallurgist')!
    await page.goto('/login?next=%2F')
    await page.getByLabel('E-mail').fill(metallurgist.email)
    await page.getByLabel('Password').fill(metallurgist.password)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.waitForURL((url) => url.pathname === '/')
    await page.addInitScript(recorderScript)
    await page.goto('/schedule')
    await page.locator('[data-testid="timeline"][data-drawn-at]').waitFor()
    const quiet = await measureNextWeek(page, QUIET)
    const busy = await measureNextWeek(page, BUSY)

    console.log(`\nweek view, ${lines.length * 2} lanes, 1280×800, headless Chromium without GPU (frame budget ${FRAME_MS.toFixed(1)} ms)`)
    console.log('loads'.padStart(6), 'draw ms'.padStart(8), 'longest task ms'.padStart(16), 'frame median'.padStart(13), 'frame p95'.padStart(10), 'frame max'.padStart(10), 'frames > 50 ms'.padStart(15))
    for (const r of [quiet, busy]) {
      console.log(
        String(r.loads).padStart(6),
        r.draw_ms.toFixed(0).padStart(8),
        r.longestTask_ms.toFixed(0).padStart(16),
        r.frames.median.toFixed(1).padStart(13),
        r.frames.p95.toFixed(1).padStart(10),
        r.frames.max.toFixed(1).padStart(10),
        `${r.frames.over50} of ${r.frames.count}`.padStart(15),
      )
    }
    console.log(
      `\n${BUSY} vs ${QUIET} loads: draw ${(busy.draw_ms / quiet.draw_ms).toFixed(2)}×, frame p95 ${(busy.frames.p95 / quiet.frames.p95).toFixed(2)}×; ` +
      `frame p95 with ${BUSY} loads is ${(busy.frames.p95 / FRAME_MS).toFixed(2)}× the 60 Hz frame.`,
    )
  } finally {
    await browser.close()
  }
} finally {
  server?.kill('SIGTERM')
  await scratch.drop()
}

interface WeekFigures {
  loads: number
  /** From the click on Later (▶) to echarts' "finished" (fetch, filtering, all progressive chunks). */
  draw_ms: number
  longestTask_ms: number
  frames: { count: number; median: number; p95: number; max: number; over50: number }
}

type Recorder = { __frames: number[]; __longTasks: { start: number; duration: number }[]; __recording: boolean }

/**
 * Steps to the next week with Later (▶), checks that it lists `loads`, waits for the timeline
 * to finish drawing, then zooms in and out with the wheel and pans by dragging for
 * about three seconds while frames are recorded.
 */
async function measureNextWeek(page: Page, loads: number): Promise<WeekFigures> {
  const timeline = page.locator('[data-testid="timeline"]')
  const clickedAt = await page.evaluate(() => performance.now())
  const [response] = await Promise.all([page.waitForResponse((r) => r.url().includes('/api/batches?')), page.getByRole('button', { name: 'Later' }).click()])
  const listed = ((await response.json()) as { batches: unknown[] }).batches.length
  if (listed !== loads) throw new Error(`expected ${loads} loads in the week, the page fetched ${listed}`)
  await page.waitForFunction((since) => Number(document.querySelector('[data-testid="timeline"]')?.getAttribute('data-drawn-at')) > since, clickedAt)
  // "finished" fires after each redraw; wait until it has been quiet for half a second so the last one counts.
  let drawnAt = Number(await timeline.getAttribute('data-drawn-at'))
  for (;;) {
    await page.waitForTimeout(500)
    const again = Number(await timeline.getAttribute('data-drawn-at'))
    if (again === drawnAt) break
    drawnAt = again
  }
  const longestTask_ms = await page.evaluate(
    (since) => Math.max(0, ...(window as unknown as Recorder).__longTasks.filter((t) => t.start >= since).map((t) => t.duration)),
    clickedAt,
  )

  await timeline.scrollIntoViewIfNeeded()
  const box = (await timeline.boundingBox())!
  // A point on the plot (right of the lane names), inside the viewport.
  const centre = { x: box.x + box.width * 0.6, y: box.y + Math.min(box.height / 2, 300) }
  await page.evaluate(() => {
    const w = window as unknown as Recorder
    w.__frames = []
    w.__recording = true
  })
  await page.mouse.move(centre.x, centre.y)
  for (let i = 0; i < 10; i++) {
    await page.mouse.wheel(0, -120)
    await page.waitForTimeout(60)
  }
  // The frames only count if the wheel really zoomed: each redraw stamps data-drawn-at anew.
  const zoomedAt = Number(await timeline.getAttribute('data-drawn-at'))
  if (!(zoomedAt > drawnAt)) throw new Error('the wheel did not redraw the timeline; the frame figures would mean nothing')
  await page.mouse.down()
  for (let i = 0; i < 30; i++) {
    await page.mouse.move(centre.x - i * 12, centre.y, { steps: 2 })
    await page.waitForTimeout(16)
  }
  await page.mouse.up()
  for (let i = 0; i < 10; i++) {
    await page.mouse.wheel(0, 120)
    await page.waitForTimeout(60)
  }
  await page.waitForTimeout(300)
  const frames = await page.evaluate(() => {
    const w = window as unknown as Recorder
    w.__recording = false
    return w.__frames
  })
  return {
    loads,
    draw_ms: drawnAt - clickedAt,
    longestTask_ms,
    frames: { count: frames.length, ...quantiles(frames), over50: frames.filter((f) => f > 50).length },
  }
}
