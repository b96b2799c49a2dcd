import { afterEach, describe, expect, it } from 'vitest'
import type { ActivityEntry, ActivityPage } from '../../shared/api'
import { activityTargetLink } from '../../src/composables/activity-format'
import { useActivityStore } from '../../src/stores/activity'
import ActivityView from '../../src/views/ActivityView.vue'
import { isolateClientState, jsonResponse, sessionFixture, stubFetch, type RecordedCall } from './fetch-stub'
import { mountInAppAt, settle } from './mount-app'

// Invented entries of an invented project 42, newest first as the server lists them.
const base: ActivityEntry = {
  id: 0, at: '2026-02-03T10:00:00.000Z', actor: { id: 7, name: 'Tobias Slipway' }, via: 'session', action: 'created',
  targetType: 'path', targetId: 310, targetName: 'Ferry', summary: 'Added path “Ferry”.', teamId: 1, projectId: 42,
}
const ran: ActivityEntry = { ...base, id: 3, via: 'token', action: 'ran', targetType: 'run', targetId: 88, targetName: 'Ferry rows #4', summary: 'Ran suite “Ferry rows”: run 4 passed (3 passed, 0 failed).' }
const trashed: ActivityEntry = { ...base, id: 2, actor: { id: 5, name: 'Morwenna Quay' }, action: 'purged', summary: 'Deleted path “Ferry” for good.' }
const added: ActivityEntry = { ...base, id: 1 }
const page = (items: ActivityEntry[], total = items.length): ActivityPage => ({
  items, total, page: 1, pageSize: 25, people: [{ id: 5, name: 'Morwenna Quay' }, { id: 7, name: 'Tobias Slipway' }],
})

isolateClientState()
afterEach(() => {
  document.body.innerHTML = ''
})

describe('activityTargetLink', () => {
  it('opens a path in the library, a run on the Suites tab, an audit itself, and nothing for what is gone or has no screen', () => {
    expect(activityTargetLink(added)).toEqual({ name: 'project-library', params: { id: '42' }, query: { path: '310' } })
    expect(activityTargetLink({ ...base, targetType: 'revision' })).toEqual({ name: 'project-library', params: { id: '42' } })
    expect(activityTargetLink(ran)).toEqual({ name: 'project-suites', params: { id: '42' }, query: { run: '88' } })
    expect(activityTargetLink({ ...base, targetType: 'audit' })).toEqual({ name: 'project-audits', params: { id: '42' }, query: { audit: '310' } })
    expect(activityTargetLink(trashed)).toBeNull()
    expect(activityTargetLink({ ...base, targetType: 'token' })).toBeNull()
    expect(activityTargetLink({ ...base, projectId: null })).toBeNull()
  })
})

describe('ActivityView', () => {
  function stub(answer: (call: RecordedCall) => ActivityPage) {
    return stubFetch({
      'GET /api/v1/auth/me': () => jsonResponse(200, sessionFixture()),
      'GET /api/v1/projects/42': () => jsonResponse(404, { error: { code: 'not_found', message: 'Not in this test.' } }),
      'GET /api/v1/projects/42/activity': (call) => jsonResponse(200, answer(call)),
    })
  }

  it('shows when, who, action, what and summary, with links where a screen exists', async () => {
    const { calls } = stub(() => page([ran, trashed, added]))
    const { wrapper } = await mountInAppAt(ActivityView, '/projects/42/activity')
    const first = calls.find((c) => c.pathname === '/api/v1/projects/42/activity')!
    expect(Object.fromEntries(first.query)).toEqual({ page: '1', pageSize: '25' })

    const rows = wrapper.findAll('[data-testid="activity-table"] tbody tr')
    expect(rows).toHaveLength(3)
    expect(rows[0].text()).toContain('Tobias Slipway')
    expect(rows[0].text()).toContain('Ran')
    expect(rows[0].text()).toContain('Ferry rows #4')
    expect(rows[0].find('[aria-label="with a personal API token"]').exists()).toBe(true)
    expect(rows[1].text()).toContain('Deleted for good')
    expect(rows[1].find('[aria-label="with a personal API token"]').exists()).toBe(false)
    expect(wrapper.get('[data-testid="activity-target-3"]').attributes('href')).toBe('/projects/42/suites?run=88')
    expect(wrapper.get('[data-testid="activity-target-1"]').attributes('href')).toBe('/projects/42/library?path=310')
    expect(wrapper.find('[data-testid="activity-target-2"]').exists()).toBe(false)
  })

  it('sends the filters to the server and starts again from the first page', async () => {
    const { calls } = stub((call) => page(call.query.get('action') === 'ran' ? [ran] : [ran, trashed, added], 60))
    const { wrapper } = await mountInAppAt(ActivityView, '/projects/42/activity')
    const activity = useActivityStore()
    activity.setPaging(2, 25)
    await settle()
    expect(calls.at(-1)!.query.get('page')).toBe('2')

    activity.setFilters({ actor: 7, action: 'ran' })
    await wrapper.get('[data-testid="activity-from-filter"] input').setValue('2026-02-01')
    await wrapper.get('[data-testid="activity-to-filter"] input').setValue('2026-02-28')
    await settle()
    expect(Object.fromEntries(calls.at(-1)!.query)).toEqual({ page: '1', pageSize: '25', actor: '7', action: 'ran', from: '2026-02-01', to: '2026-02-28' })
    expect(wrapper.findAll('[data-testid="activity-table"] tbody tr')).toHaveLength(1)

    await wrapper.get('[data-testid="activity-clear-filters"]').trigger('click')
    await settle()
    expect(Object.fromEntries(calls.at(-1)!.query)).toEqual({ page: '1', pageSize: '25' })
  })

  it('says so when nothing matches the filters', async () => {
    stub(() => page([]))
    const { wrapper } = await mountInAppAt(ActivityView, '/projects/42/activity')
    expect(wrapper.text()).toContain('No activity yet')
    useActivityStore().setFilters({ targetType: 'audit' })
    await settle()
    expect(wrapper.text()).toContain('Nothing matches these filters')
  })
})
