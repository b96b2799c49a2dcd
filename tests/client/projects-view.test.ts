import { afterEach, describe, expect, it } from 'vitest'
import type { Project, Role } from '../../shared/api'
import ProjectsView from '../../src/views/ProjectsView.vue'
import { errorResponse, isolateClientState, jsonResponse, sessionFixture, stubFetch } from './fetch-stub'
import { mountAt, settle } from './mount-app'

const wayfinding: Project = {
  id: 42,
  teamId: 3,
  name: 'Wayfinding icons',
  description: 'Arrows, a map pin, a ferry',
  pathCount: 12,
  createdAt: '2026-10-01T08:00:00.000Z',
  updatedAt: '2026-11-15T12:30:00.000Z',
  createdBy: 'Ines Ortega',
}

function signedInAs(role: Role, extraRoutes: Parameters<typeof stubFetch>[0] = {}) {
  return stubFetch({
    'GET /api/v1/auth/me': () =>
      jsonResponse(200, sessionFixture({ teams: [{ id: 3, name: 'Harbour Type Workshop', role }] })),
    'GET /api/v1/teams/3/projects': () => jsonResponse(200, { items: [wayfinding], total: 1, page: 1, pageSize: 10 }),
    ...extraRoutes,
  })
}

isolateClientState()
afterEach(() => {
  document.body.innerHTML = ''
})

describe('ProjectsView', () => {
  it('lists the team’s projects in the table', async () => {
    signedInAs('viewer')
    const { wrapper } = await mountAt(ProjectsView, '/projects')
    const table = wrapper.get('[data-testid="projects-table"]')
    expect(table.text()).toContain('Wayfinding icons')
    expect(table.text()).toContain('Arrows, a map pin, a ferry')
  })

  // Issue 2's role matrix: viewers read, editors also create and rename, owners also delete.
  const actionsByRole: [Role, boolean, boolean, boolean][] = [
    ['viewer', false, false, false],
    ['editor', true, true, false],
    ['owner', true, true, true],
  ]
  it.each(actionsByRole)('shows a %s: new project %s, rename %s, delete %s', async (role, create, rename, remove) => {
    signedInAs(role)
    const { wrapper } = await mountAt(ProjectsView, '/projects')
    expect(wrapper.find('[data-testid="new-project-button"]').exists()).toBe(create)
    expect(wrapper.find('[data-testid="rename-project-button"]').exists()).toBe(rename)
    expect(wrapper.find('[data-testid="delete-project-button"]').exists()).toBe(remove)
  })

  it('shows the server’s refusal inside the new-project dialog', async () => {
    const { calls } = signedInAs('editor', {
      'POST /api/v1/teams/3/projects': () =>
        errorResponse(409, 'conflict', 'A project named “Wayfinding icons” already exists in this team.'),
    })
    const { wrapper } = await mountAt(ProjectsView, '/projects')
    await wrapper.get('[data-testid="new-project-button"]').trigger('click')
    await settle()

    // The dialog is teleported to the overlay container at the end of <body>.
    const input = document.querySelector<HTMLInputElement>('[data-testid="project-name-input"] input')
    expect(input).not.toBeNull()
    input!.value = 'Wayfinding icons'
    input!.dispatchEvent(new Event('input'))
    await settle()
    document.querySelector<HTMLButtonElement>('[data-testid="create-project-confirm"]')!.click()
    await settle()

    expect(calls.find((call) => call.method === 'POST')?.body).toEqual({ name: 'Wayfinding icons', description: '' })
    expect(document.querySelector('[data-testid="project-dialog-error"]')?.textContent).toContain(
      'A project named “Wayfinding icons” already exists in this team.',
    )
  })
})
