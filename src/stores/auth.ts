import { defineStore } from 'pinia'
import { computed, readonly, ref, shallowRef } from 'vue'
import type { Role, SessionInfo, TeamMembership, User } from '../../shared/api'
import { getSession, login, logout } from '../api/auth'
import { updateProfile } from '../api/account'
import { toApiRequestError, type ApiRequestError } from '../api/http'
import { useStoredRef } from '../composables/useStoredRef'

export const TEAM_STORAGE_KEY = 'rootcast.teamId'

function parseTeamId(raw: string): number | null | undefined {
  const id = Number(raw)
  return Number.isInteger(id) && id > 0 ? id : undefined
}

/** Roles that may create and change work (product.md: editors and owners). */
export function roleCanEdit(role: Role | null): boolean {
  return role === 'owner' || role === 'editor'
}

/** Only owners manage the team and delete projects. */
export function roleIsOwner(role: Role | null): boolean {
  return role === 'owner'
}

/** The signed-in user, their teams and roles, the chosen team and the session's CSRF token. */
export const useAuthStore = defineStore('auth', () => {
  const user = ref<User | null>(null)
  const teams = ref<TeamMembership[]>([])
  const csrfToken = ref<string | null>(null)
  const isLoading = ref(false)
  const error = shallowRef<ApiRequestError | null>(null)
  /** True once the server has been asked who is signed in (the route guard waits for it). */
  const hasCheckedSession = ref(false)
  const chosenTeamId = useStoredRef<number | null>(TEAM_STORAGE_KEY, parseTeamId, null)

  const isSignedIn = computed(() => user.value !== null)
  const currentTeam = computed<TeamMembership | null>(
    () => teams.value.find((team) => team.id === chosenTeamId.value) ?? teams.value[0] ?? null,
  )
  const currentTeamId = computed(() => currentTeam.value?.id ?? null)
  const role = computed<Role | null>(() => currentTeam.value?.role ?? null)
  const canEdit = computed(() => roleCanEdit(role.value))
  const isOwner = computed(() => roleIsOwner(role.value))

  /** The user's role in any of their teams; null for a team they do not belong to. */
  function roleIn(teamId: number): Role | null {
    return teams.value.find((team) => team.id === teamId)?.role ?? null
  }
  function canEditIn(teamId: number): boolean {
    return roleCanEdit(roleIn(teamId))
  }
  function isOwnerOf(teamId: number): boolean {
    return roleIsOwner(roleIn(teamId))
  }

  function applySession(session: SessionInfo): void {
    user.value = session.user
    teams.value = session.teams
    csrfToken.value = session.csrfToken
  }

  /** Forgets the session locally (the chosen team is kept for the next sign-in). */
  function clearSession(): void {
    user.value = null
    teams.value = []
    csrfToken.value = null
  }

  /** Asks the server who is signed in. A network failure leaves the user signed out with `error` set. */
  async function loadSession(): Promise<void> {
    isLoading.value = true
    error.value = null
    try {
      const session = await getSession()
      if (session === null) clearSession()
      else applySession(session)
    } catch (cause) {
      clearSession()
      error.value = toApiRequestError(cause)
    } finally {
      isLoading.value = false
      hasCheckedSession.value = true
    }
  }

  /** Signs in; resolves to false with `error` set when the server refuses or cannot be reached. */
  async function signIn(email: string, password: string): Promise<boolean> {
    isLoading.value = true
    error.value = null
    try {
      applySession(await login({ email, password }))
      hasCheckedSession.value = true
      return true
    } catch (cause) {
      clearSession()
      error.value = toApiRequestError(cause)
      return false
    } finally {
      isLoading.value = false
    }
  }

  /** Signs out on the server; the local session ends even when that call fails. */
  async function signOut(): Promise<void> {
    isLoading.value = true
    error.value = null
    try {
      await logout()
    } catch {
      // The cookie may already be gone (server restarted without the session, or offline).
    } finally {
      clearSession()
      isLoading.value = false
    }
  }

  /** Changes the display name on the server and here; throws the ApiRequestError for the form to show. */
  async function updateDisplayName(displayName: string): Promise<void> {
    applySession(await updateProfile({ displayName }))
  }

  /** Makes one of the user's teams current and remembers the choice in this browser. */
  function selectTeam(teamId: number): void {
    if (teams.value.some((team) => team.id === teamId)) chosenTeamId.value = teamId
  }

  return {
    user: readonly(user),
    teams: readonly(teams),
    csrfToken: readonly(csrfToken),
    isLoading: readonly(isLoading),
    error: readonly(error),
    hasCheckedSession: readonly(hasCheckedSession),
    isSignedIn,
    currentTeam,
    currentTeamId,
    role,
    canEdit,
    isOwner,
    roleIn,
    canEditIn,
    isOwnerOf,
    loadSession,
    signIn,
    signOut,
    clearSession,
    selectTeam,
    updateDisplayName,
  }
})
