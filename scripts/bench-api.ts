// npm run bench:api — HTTP figures of the built server on a scratch database (dropped
// afterwards), with autocannon:
// - the floor poll, the plans list and a plan preview at 32 concurrent clients, with one
//   server process and with two on one database. The clients are two autocannon runs of
//   16 side by side, both on the one process or one on each of the two: the same client
//   work either way, and no relay in this process (a shop's proxy runs on its own cores);
// - where the CPU went during each run: the servers, MariaDB, this script (the clients)
//   and everything else on the machine, in cores, from /proc;
// - the floor poll's p95 alone and while four clients run graded (case-hardened) previews;
// - the floor poll's size for 40 cards (raw, gzipped, and the 304 when unchanged), and the
//   JavaScript /floor loads (its module scripts and preloads, gzipped).
// Prints figures and ratios; never fails on time.
import { spawn, type ChildProcess } from 'node:child_process'
import { request } from 'node:http'
import { readFileSync } from 'node:fs'
import { availableParallelism } from 'node:os'
import { gzipSync } from 'node:zlib'
import autocannon from 'autocannon'
import { demoPlanRevisions } from '../server/db/demo/schedule'
import { DEMO_USERS } from '../server/db/demo/shop'
import { formatShares, sampleCpu, type CpuShares } from './bench/cpuShares'
import { quantiles } from './bench/quantiles'
import { benchBatch, benchLines, insertBatches, root, scratchDatabase, sh } from './bench/scratchDatabase'

const BASE_PORT = Number(process.env.SLAKEWISE_BENCH_APP_PORT ?? 3190)
const CLIENTS = 32
const SECONDS = Number(process.env.SLAKEWISE_BENCH_SECONDS ?? 8)
const FLOOR_CARDS = 40

interface Figures {
  p50: number
  p95: number
  perSecond: number
  failed: number
  /** CPU use during the run, in cores. */
  cpu: CpuShares
}

/** The processes whose CPU use each run reports, filled in once they are up. */
const watched: Record<string, number> = {}

interface RequestShape {
  method?: string
  headers: Record<string, string>
  body?: () => string
}

/**
 * Runs one autocannon per URL side by side, `connections` split evenly between them,
 * timing each answer itself (autocannon reports no p95).
 */
async function measure(urls: string[], connections: number, options: RequestShape): Promise<Figures> {
  const latencies: number[] = []
  const cpu = sampleCpu(watched)
  const results = await Promise.all(
    urls.map((url) =>
      autocannon({
        url,
        connections: connections / urls.length,
        duration: SECONDS,
        requests: [{ method: options.method ?? 'GET', headers: options.headers, setupRequest: (request) => (options.body ? { ...request, body: options.body() } : request) }],
        setupClient: (client) => client.on('response', (_status: number, _bytes: number, time: number) => latencies.push(time)),
      }),
    ),
  )
  const shares = cpu()
  const q = quantiles(latencies)
  const sum = (pick: (result: (typeof results)[number]) => number) => results.reduce((total, result) => total + pick(result), 0)
  return {
    p50: q.median,
    p95: q.p95,
    perSecond: sum((r) => r.requests.total) / Math.max(...results.map((r) => r.duration)),
    failed: sum((r) => r.non2xx + r.errors + r.timeouts),
    cpu: shares,
  }
}

function startServer(port: number, databaseUrl: string): ChildProcess {
  return spawn('node', ['.output/server/index.mjs'], {
    cwd: root,
    stdio: ['ignore', 'ignore', 'inherit'],
    env: {
      ...process.env,
      DATABASE_URL: databaseUrl,
      PORT: String(port),
      NITRO_HOST: '127.0.0.1',
      AUTH_ORIGIN: `http://127.0.0.1:${port}/api/auth`,
      NUXT_AUTH_SECRET: 'slakewise-bench-secret-not-for-production',
      NUXT_RECORD_SEAL_KEY: 'slakewise-bench-record-seal-key-not-for-production',
      OUTBOX_WORKER: 'off',
      NODE_ENV: 'production',
    },
  })
}

/** Signs in through next-auth's credentials endpoints; returns the cookie header. */
async function signIn(base: string, role: string): Promise<string> {
  const user = DEMO_USERS.find((u) => u.role === role)!
  const jar = new Map<string, string>()
  const keep = (response: Response) => {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const index = pair!.indexOf('=')
      jar.set(pair!.slice(0, index), pair!.slice(index + 1))
    }
  }
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join('; ')
  const csrf = await fetch(`${base}/api/auth/csrf`)
  keep(csrf)
  const { csrfToken } = (await csrf.json()) as { csrfToken: string }
  const form = new URLSearchParams({ csrfToken, email: user.email, password: user.password, json: 'true', callbackUrl: '/' })
  keep(await fetch(`${base}/api/auth/callback/credentials`, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded', 'cookie': cookie() }, body: form, redirect: 'manual' }))
  if (![...jar.keys()].some((name) => name.endsWith('next-auth.session-token'))) throw new Error(`sign-in as ${role} failed`)
  return cookie()
}

/** The size of a GET's body as sent on the wire (fetch would unzip it), and its content-encoding. */
function wireSize(url: string, headers: Record<string, string>): Promise<{ bytes: number; encoding: string }> {
  return new Promise((resolve, reject) => {
    request(url, { headers }, (res) => {
      let bytes = 0
      res.on('data', (chunk: Buffer) => (bytes += chunk.length))
      res.on('end', () => resolve({ bytes, encoding: String(res.headers['content-encoding'] ?? 'none') }))
    })
      .on('error', reject)
      .end()
  })
}

/** The module scripts and module preloads of a page, gzipped, as the browser would fetch them. */
async function pageScripts(base: string, path: string, cookie: string) {
  const html = await (await fetch(`${base}${path}`, { headers: { cookie } })).text()
  const urls = new Set<string>()
  for (const match of html.matchAll(/<script[^>]+type="module"[^>]+src="([^"]+)"|<link[^>]+rel="modulepreload"[^>]+href="([^"]+)"|<link[^>]+href="([^"]+)"[^>]+rel="modulepreload"/g)) urls.add(match[1] ?? match[2] ?? match[3]!)
  const prefetched = [...html.matchAll(/<link[^>]+rel="prefetch"[^>]+href="([^"]+\.js)"|<link[^>]+href="([^"]+\.js)"[^>]+rel="prefetch"/g)].map((m) => m[1] ?? m[2]!)
  const size = async (list: Iterable<string>) => {
    let total = 0
    for (const url of list) total += gzipSync(Buffer.from(await (await fetch(new URL(url, base))).arrayBuffer())).length
    return total
  }
  return { scripts: urls.size, gzip: await size(urls), prefetched: prefetched.length, prefetchedGzip: await size(prefetched) }
}

const scratch = await scratchDatabase('api')
const servers: ChildProcess[] = []
try {
  // 40 loads on the floor: each on its own furnace and tank, charged within the next few hours.
  const plan = (await demoPlanRevisions(scratch.db))[0]!
  const lines = await benchLines(scratch.db, FLOOR_CARDS)
  const now = Date.now()
  await insertBatches(scratch.db, lines.map((line, i) => benchBatch(i + 1, plan, line, now + (i + 1) * 5 * 60_000)))
  console.log(`[bench] ${FLOOR_CARDS} loads due on ${lines.length} furnaces (scratch database ${scratch.name})`)

  sh(['-c', 'source scripts/lib.sh && mkdir -p .data && build_if_stale'])
  const ports = [BASE_PORT, BASE_PORT + 1]
  for (const port of ports) servers.push(startServer(port, scratch.url))
  for (const port of ports) sh(['-c', `source scripts/lib.sh && wait_for_url http://127.0.0.1:${port}/api/health`])
  watched['server A'] = servers[0]!.pid!
  watched['server B'] = servers[1]!.pid!
  watched.mariadb = Number(readFileSync(`${root}.data/dev/mariadb.pid`, 'utf8'))
  const direct = `http://127.0.0.1:${ports[0]}`
  // A session is a signed token: valid on both processes, which share the secret.
  const cookie = await signIn(direct, 'metallurgist')
  const json = { cookie, accept: 'application/json' }

  const plans = (await (await fetch(`${direct}/api/plans`, { headers: json })).json()) as { id: number; name: string }[]
  const specOf = async (id: number) => {
    const { spec } = (await (await fetch(`${direct}/api/plans/${id}`, { headers: json })).json()) as { spec: Record<string, unknown> & { library: { material: { gradedProfile: unknown } }; handling: { below_C: number } } }
    return spec
  }
  const specs = await Promise.all(plans.map((p) => specOf(p.id)))
  const uniform = specs.find((s) => !s.library.material.gradedProfile)!
  const graded = specs.find((s) => s.library.material.gradedProfile)!
  // Each request a slightly different handling temperature: distinct plans, so no two share one job.
  let variant = 0
  const previewBody = (spec: typeof uniform) => () => {
    const { library: _library, ...rest } = spec
    return JSON.stringify({ ...rest, handling: { ...spec.handling, below_C: spec.handling.below_C + (variant++ % 1000) * 1e-3 } })
  }
  const post = { method: 'POST', headers: { ...json, 'content-type': 'application/json' } }

  // Floor payload.
  const floor = await fetch(`${direct}/api/floor`, { headers: json })
  const floorText = await floor.text()
  const cards = (JSON.parse(floorText) as { batches: unknown[] }).batches.length
  const again = await fetch(`${direct}/api/floor`, { headers: { ...json, 'if-none-match': floor.headers.get('etag') ?? '' } })
  const zipped = await wireSize(`${direct}/api/floor`, { ...json, 'accept-encoding': 'gzip' })
  const floorJs = await pageScripts(direct, '/floor', cookie)
  const plansJs = await pageScripts(direct, '/plans/new', cookie)

  const cases = [
    { name: 'floor poll (GET /api/floor)', path: '/api/floor', options: { headers: json } },
    { name: 'plans list (GET /api/plans)', path: '/api/plans', options: { headers: json } },
    { name: 'plan preview, uniform (POST)', path: '/api/plans/preview', options: { ...post, body: previewBody(uniform) } },
  ]
  const table: { name: string; one: Figures; two: Figures }[] = []
  for (const c of cases) {
    const one = await measure([ports[0]!, ports[0]!].map((port) => `http://127.0.0.1:${port}${c.path}`), CLIENTS, c.options)
    const two = await measure(ports.map((port) => `http://127.0.0.1:${port}${c.path}`), CLIENTS, c.options)
    table.push({ name: c.name, one, two })
  }

  const floorAlone = await measure([`${direct}/api/floor`], 4, { headers: json })
  const [floorBusy, gradedLoad] = await Promise.all([
    measure([`${direct}/api/floor`], 4, { headers: json }),
    measure([`${direct}/api/plans/preview`], 4, { ...post, body: previewBody(graded) }),
  ])
  const health = (await (await fetch(`${direct}/api/health`)).json()) as { engine: unknown }

  const ms = (v: number) => v.toFixed(0).padStart(7)
  console.log(`\n${CLIENTS} concurrent clients (two autocannon runs of ${CLIENTS / 2} in this process), ${SECONDS} s each; 1 proc: both runs on server A; 2 proc: one run on each of servers A and B, one database`)
  console.log('(no proxy in between: a shop\'s reverse proxy runs on its own machine or cores, not on the two the servers use)')
  console.log('case'.padEnd(32), '1 proc p50'.padStart(10), 'p95'.padStart(7), 'req/s'.padStart(7), ' | ', '2 proc p50'.padStart(10), 'p95'.padStart(7), 'req/s'.padStart(7), ' | ', 'req/s ratio'.padStart(11), 'failed')
  for (const row of table) {
    console.log(
      row.name.padEnd(32),
      ms(row.one.p50).padStart(10), ms(row.one.p95), ms(row.one.perSecond), ' | ',
      ms(row.two.p50).padStart(10), ms(row.two.p95), ms(row.two.perSecond), ' | ',
      `${(row.two.perSecond / row.one.perSecond).toFixed(2)}×`.padStart(11), `${row.one.failed}/${row.two.failed}`,
    )
  }
  console.log(`\nCPU during each run, in cores (${availableParallelism()} on this machine); self = this script, the clients`)
  for (const row of table) {
    console.log(`${row.name.padEnd(32)} 1 proc: ${formatShares(row.one.cpu)}`)
    console.log(`${''.padEnd(32)} 2 proc: ${formatShares(row.two.cpu)}`)
  }
  console.log(`${'floor poll beside graded previews'.padEnd(32)} ${formatShares(floorBusy.cpu)}`)
  // About the ratio two processes can reach on these cores if each request costs what it did on one:
  // the cores the servers had in the two-process run (all but the database's, the clients' and the
  // rest's) over what one server used alone. An estimate: contention changes the cost per request.
  console.log(`\nreq/s ratio the ${availableParallelism()} cores allow at one process's CPU per request, about (cores left to the servers with two / cores one server used):`)
  for (const row of table) {
    const left = availableParallelism() - row.two.cpu.mariadb! - row.two.cpu.self! - row.two.cpu.others!
    console.log(`${row.name.padEnd(32)} ${(left / row.one.cpu['server A']!).toFixed(2)}× (measured ${(row.two.perSecond / row.one.perSecond).toFixed(2)}×)`)
  }
  console.log(`\nfloor poll, 4 clients, one process: p95 ${floorAlone.p95.toFixed(0)} ms alone; ${floorBusy.p95.toFixed(0)} ms while 4 clients preview the graded plan (${gradedLoad.perSecond.toFixed(1)} previews/s, p50 ${gradedLoad.p50.toFixed(0)} ms); ratio ${(floorBusy.p95 / floorAlone.p95).toFixed(1)}× (target under 40 ms)`)
  console.log(`engine after the runs: ${JSON.stringify(health.engine)}`)
  console.log(`\nfloor poll for ${cards} cards: ${Buffer.byteLength(floorText)} B raw (target under 20,000 for 40), ${zipped.bytes} B as sent to a client accepting gzip (content-encoding ${zipped.encoding}); unchanged → ${again.status}`)
  console.log(`/floor loads ${floorJs.scripts} module scripts, ${(floorJs.gzip / 1000).toFixed(0)} kB gzipped (target under 200), and hints ${floorJs.prefetched} more for prefetch (${(floorJs.prefetchedGzip / 1000).toFixed(0)} kB)`)
  console.log(`/plans/new (a chart page) loads ${plansJs.scripts} module scripts, ${(plansJs.gzip / 1000).toFixed(0)} kB gzipped`)
} finally {
  for (const server of servers) server.kill('SIGTERM')
  await scratch.drop()
}
