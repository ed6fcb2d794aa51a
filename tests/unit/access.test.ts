import { existsSync, readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { ACCESS, can, type Capability } from '../../shared/access'
import { ROLES, isRole, type Role } from '../../shared/roles'
import { NAV_ITEMS } from '../../shared/navigation'

type AccessTable = Record<Capability, readonly Role[]>

/** An API call a page makes; `when` is the capability or the role the page shows its control to. */
interface Call {
  call: string
  via?: string
  when?: Capability | Role
}

// Page → the API calls it (or the components it shows) makes. The test checks this map
// against the sources, so a new fetch in a page without an entry here fails.
const PAGE_CALLS: Record<string, Call[]> = {
  'pages/index.vue': [
    { call: 'GET /api/floor', via: 'components/shift/ShiftOperatorPanel.vue', when: 'operator' },
    { call: 'GET /api/records', via: 'components/shift/ShiftQaPanel.vue', when: 'qa' },
    { call: 'GET /api/plans', via: 'components/shift/ShiftMetallurgistPanel.vue', when: 'metallurgist' },
    { call: 'GET /api/batches', via: 'components/shift/ShiftMetallurgistPanel.vue', when: 'metallurgist' },
    { call: 'GET /api/furnaces', via: 'components/shift/ShiftMetallurgistPanel.vue', when: 'metallurgist' },
    { call: 'GET /api/schedule/plan-revisions', via: 'components/shift/ShiftMetallurgistPanel.vue', when: 'metallurgist' },
    { call: 'GET /api/users', via: 'components/shift/ShiftAdminPanel.vue', when: 'admin' },
    { call: 'GET /api/furnaces', via: 'components/shift/ShiftAdminPanel.vue', when: 'admin' },
  ],
  'pages/plans/index.vue': [{ call: 'GET /api/plans' }, { call: 'POST /api/plans/[id]/archive', when: 'plans.edit' }],
  'pages/plans/new.vue': [
    { call: 'POST /api/plans' },
    { call: 'GET /api/plans/library', via: 'components/plan/PlanEditor.vue' },
    { call: 'POST /api/plans/preview', via: 'components/plan/PlanEditor.vue' },
    { call: 'POST /api/plans/check', via: 'components/plan/PlanEditor.vue' },
  ],
  'pages/plans/[id].vue': [
    { call: 'GET /api/plans/[id]' },
    { call: 'GET /api/plans/[id]/revisions/[revision]' },
    { call: 'GET /api/plans/[id]/curve.csv' },
    { call: 'POST /api/plans/[id]/revisions', when: 'plans.edit' },
    { call: 'POST /api/plans/[id]/duplicate', when: 'plans.edit' },
    { call: 'GET /api/plans/library', via: 'components/plan/PlanEditor.vue' },
    { call: 'POST /api/plans/preview', via: 'components/plan/PlanEditor.vue' },
    { call: 'POST /api/plans/check', via: 'components/plan/PlanEditor.vue' },
  ],
  'pages/plans/compare.vue': [{ call: 'GET /api/plans' }, { call: 'GET /api/plans/[id]' }],
  'pages/schedule/index.vue': [
    { call: 'GET /api/furnaces' },
    { call: 'GET /api/quench-stations' },
    { call: 'GET /api/schedule/settings' },
    { call: 'GET /api/batches' },
    { call: 'GET /api/schedule/plan-revisions', via: 'components/schedule/ScheduleBookingForm.vue', when: 'schedule.book' },
    { call: 'POST /api/batches', via: 'components/schedule/ScheduleBookingForm.vue', when: 'schedule.book' },
    { call: 'PATCH /api/batches/[id]', via: 'components/schedule/ScheduleBookingForm.vue', when: 'schedule.book' },
  ],
  'pages/schedule/[id].vue': [
    { call: 'GET /api/batches/[id]' },
    { call: 'POST /api/batches/[id]/events', when: 'schedule.book' },
    { call: 'GET /api/furnaces' },
    { call: 'GET /api/quench-stations' },
    { call: 'GET /api/schedule/plan-revisions', via: 'components/schedule/ScheduleBookingForm.vue', when: 'schedule.book' },
    { call: 'PATCH /api/batches/[id]', via: 'components/schedule/ScheduleBookingForm.vue', when: 'schedule.book' },
    { call: 'POST /api/batches', via: 'components/schedule/ScheduleBookingForm.vue', when: 'schedule.book' },
  ],
  'pages/floor.vue': [
    { call: 'GET /api/furnaces' },
    { call: 'GET /api/floor' },
    { call: 'GET /api/floor/curves', via: 'composables/useFloorCurves.ts' },
    { call: 'POST /api/batches/[id]/events', when: 'floor.record' },
    { call: 'POST /api/batches/[id]/events/[eventId]/corrections', via: 'components/batch/BatchTapCorrection.vue' },
  ],
  'pages/records/index.vue': [{ call: 'GET /api/records' }, { call: 'GET /api/furnaces' }],
  'pages/records/[id].vue': [
    { call: 'GET /api/records/[id]' },
    { call: 'POST /api/records/[id]/approve', via: 'components/record/RecordSignOff.vue', when: 'records.signOff' },
    { call: 'POST /api/records/[id]/reject', via: 'components/record/RecordSignOff.vue', when: 'records.signOff' },
    { call: 'GET /api/batches/[id]', when: 'records.correct' },
    { call: 'POST /api/batches/[id]/events/[eventId]/corrections', via: 'components/batch/BatchTapCorrection.vue', when: 'records.correct' },
  ],
  'pages/library/materials.vue': [
    { call: 'GET /api/materials' },
    { call: 'POST /api/materials', via: 'composables/useLibraryEditing.ts', when: 'library.edit' },
    { call: 'PATCH /api/materials/[id]', via: 'composables/useLibraryEditing.ts', when: 'library.edit' },
  ],
  'pages/library/quenchants.vue': [
    { call: 'GET /api/quenchants' },
    { call: 'GET /api/calibrations' },
    { call: 'POST /api/quenchants', via: 'composables/useLibraryEditing.ts', when: 'library.edit' },
    { call: 'PATCH /api/quenchants/[id]', via: 'composables/useLibraryEditing.ts', when: 'library.edit' },
  ],
  'pages/admin/furnaces.vue': [
    { call: 'GET /api/furnaces' },
    { call: 'GET /api/quench-stations' },
    { call: 'GET /api/schedule/settings' },
    { call: 'POST /api/furnaces' },
    { call: 'POST /api/quench-stations' },
    { call: 'PATCH /api/furnaces/[id]' },
    { call: 'PATCH /api/quench-stations/[id]' },
    { call: 'PATCH /api/schedule/settings' },
  ],
  'pages/admin/users.vue': [
    { call: 'GET /api/users' },
    { call: 'PATCH /api/users/[id]' },
    { call: 'POST /api/users', via: 'components/admin/AdminUserForm.vue' },
  ],
  'pages/logs/index.vue': [
    { call: 'GET /api/logs' },
    { call: 'POST /api/logs/preview', via: 'components/log/LogUploadForm.vue', when: 'logs.upload' },
    { call: 'POST /api/logs', via: 'components/log/LogUploadForm.vue', when: 'logs.upload' },
  ],
  'pages/logs/[id].vue': [{ call: 'GET /api/logs/[id]' }, { call: 'GET /api/logs/[id]/file' }],
  'pages/calibration.vue': [
    { call: 'GET /api/logs' },
    { call: 'GET /api/plans' },
    { call: 'POST /api/calibrations/fit', via: 'composables/useCalibrationFit.ts' },
    { call: 'GET /api/quenchants', via: 'components/calibration/CalibrationSavePanel.vue' },
    { call: 'POST /api/calibrations', via: 'components/calibration/CalibrationSavePanel.vue' },
  ],
  'pages/admin/audit.vue': [{ call: 'GET /api/audit' }, { call: 'GET /api/audit/people' }],
  'pages/admin/outbox.vue': [{ call: 'GET /api/outbox' }, { call: 'POST /api/outbox/[id]/retry' }, { call: 'POST /api/outbox/test-sheet' }],
  'pages/admin/mail-recipients.vue': [{ call: 'GET /api/mail-recipients' }, { call: 'PUT /api/mail-recipients/[kind]' }],
}

const source = (path: string) => readFileSync(path, 'utf8')

/** The capability a page's definePageMeta names; every signed-in page names one. */
function pageCapability(pageSource: string): string | undefined {
  return pageSource.match(/definePageMeta\(\{[^}]*capability: '([^']+)'/)?.[1]
}

/** The capability a route file passes to requireRole. */
function routeCapability(method: string, path: string): string {
  const base = `server${path}`
  const file = [`${base}.${method.toLowerCase()}.ts`, `${base}/index.${method.toLowerCase()}.ts`].find(existsSync)
  if (!file) throw new Error(`no route file for ${method} ${path}`)
  const capability = source(file).match(/requireRole\(event, '([^']+)'\)/)?.[1]
  if (!capability) throw new Error(`${file} has no requireRole(event, '<capability>')`)
  return capability
}

/** `/api/...` URLs in a source file, with `${...}` segments as wildcards. */
function apiUrlPatterns(text: string): RegExp[] {
  return [...text.matchAll(/['`](\/api\/[^'`?]*)/g)].map(
    ([, url]) => new RegExp(`^${url!.replace(/[.]/g, '\\.').replace(/\$\{[^}]*\}/g, '[^/]+')}$`),
  )
}

const rolesOf = (access: AccessTable, capability: string): readonly Role[] => {
  const roles = access[capability as Capability]
  if (!roles) throw new Error(`unknown capability ${capability}`)
  return roles.length === 0 ? ROLES : roles
}

/** Every disagreement between page guards, navigation and the routes pages call. */
function accessProblems(access: AccessTable, pages: Record<string, Call[]>, nav: readonly { to: string; capability: string }[]): string[] {
  const problems: string[] = []
  for (const [page, calls] of Object.entries(pages)) {
    const pageCap = pageCapability(source(page))
    if (!pageCap) {
      problems.push(`${page} names no capability in definePageMeta`)
      continue
    }
    const admitted = rolesOf(access, pageCap)
    for (const { call, when } of calls) {
      const [method, path] = call.split(' ') as [string, string]
      const shownTo = when === undefined ? admitted : isRole(when) ? [when] : admitted.filter((role) => rolesOf(access, when).includes(role))
      const routeRoles = rolesOf(access, routeCapability(method, path))
      for (const role of shownTo.filter((r) => admitted.includes(r))) {
        if (!routeRoles.includes(role)) problems.push(`${page} lets ${role} call ${call}, which refuses ${role}`)
      }
    }
    const route = '/' + page.replace(/^pages\//, '').replace(/\.vue$/, '').replace(/(^|\/)index$/, '')
    const entry = nav.find((item) => item.to === route.replace(/\/$/, '') || (route === '/' && item.to === '/'))
    if (entry && rolesOf(access, entry.capability).join() !== admitted.join()) {
      problems.push(`${page} admits ${admitted.join(', ')} but its navigation entry shows to ${rolesOf(access, entry.capability).join(', ')}`)
    }
  }
  return problems
}

describe('can', () => {
  it.each([
    ['admin', 'people.manage', true],
    ['qa', 'people.manage', false],
    ['qa', 'records.signOff', true],
    ['admin', 'records.signOff', false],
    ['metallurgist', 'floor.view', true],
    ['metallurgist', 'floor.record', false],
    ['metallurgist', 'records.correct', true],
    ['qa', 'records.correct', true],
    ['operator', 'records.correct', false],
    ['operator', 'plans.read', true],
    ['operator', 'plans.edit', false],
    ['metallurgist', 'media.calibrate', true],
    ['qa', 'media.calibrate', false],
    ['operator', 'library.read', true],
    [undefined, 'signedIn', false],
    [undefined, 'people.manage', false],
  ] as const)('%s may %s → %s', (role, capability, expected) => {
    expect(can(role, capability)).toBe(expected)
  })

  it('names only the four roles', () => {
    expect(Object.values(ACCESS).flat().every(isRole)).toBe(true)
  })
})

describe('the access table agrees with pages, navigation and routes', () => {
  it('maps every signed-in page, and every /api URL in it and its components', () => {
    const pages = Object.keys(PAGE_CALLS)
    for (const page of pages) {
      const calls = PAGE_CALLS[page]!
      const files = [page, ...new Set(calls.flatMap((c) => (c.via ? [c.via] : [])))]
      for (const file of files) {
        const mapped = calls.filter((c) => (c.via ?? page) === file).map((c) => c.call.split(' ')[1]!)
        const patterns = apiUrlPatterns(source(file))
        for (const pattern of patterns) expect(mapped.some((p) => pattern.test(p)), `${file}: ${pattern} unmapped`).toBe(true)
        for (const path of mapped) expect(patterns.some((p) => p.test(path)), `${file} does not call ${path}`).toBe(true)
      }
    }
    expect(NAV_ITEMS.every((item) => pages.some((p) => p === `pages${item.to === '/' ? '/index' : item.to}.vue` || p === `pages${item.to}/index.vue`))).toBe(true)
  })

  it('finds no page that admits a role its routes or navigation entry refuse', () => {
    expect(accessProblems(ACCESS, PAGE_CALLS, NAV_ITEMS)).toEqual([])
  })

  it('catches a route narrower than the page that calls it', () => {
    const narrowed = { ...ACCESS, 'equipment.read': ['admin'] } as AccessTable
    expect(accessProblems(narrowed, { 'pages/records/index.vue': PAGE_CALLS['pages/records/index.vue']! }, [])).toEqual([
      'pages/records/index.vue lets qa call GET /api/furnaces, which refuses qa',
      'pages/records/index.vue lets metallurgist call GET /api/furnaces, which refuses metallurgist',
    ])
  })

  it('catches a navigation entry that disagrees with its page guard', () => {
    const problems = accessProblems(ACCESS, { 'pages/floor.vue': PAGE_CALLS['pages/floor.vue']! }, [{ to: '/floor', capability: 'floor.record' }])
    expect(problems).toEqual(['pages/floor.vue admits operator, admin, metallurgist but its navigation entry shows to operator, admin'])
  })
})
