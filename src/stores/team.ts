import { defineStore } from 'pinia'
import { readonly, ref } from 'vue'
import type { Invitation, Member, NewInvitation, Role } from '../../shared/api'
import {
  changeMemberRole,
  createInvitation,
  listInvitations,
  listMembers,
  removeMember,
  resendInvitation,
  revokeInvitation,
} from '../api/team'
import { useLoadedList } from '../composables/useLoadedList'

/**
 * The current team's members and open invitations. Changes throw the ApiRequestError for
 * the dialog that asked, and reload the list they touch.
 */
export const useTeamStore = defineStore('team', () => {
  const teamId = ref<number | null>(null)
  const members = useLoadedList<Member>(() => (teamId.value === null ? Promise.resolve([]) : listMembers(teamId.value)))
  const invitations = useLoadedList<Invitation>(() => (teamId.value === null ? Promise.resolve([]) : listInvitations(teamId.value)))

  function requireTeam(): number {
    if (teamId.value === null) throw new Error('Choose a team first.')
    return teamId.value
  }

  /** Shows another team: its lists start empty until loaded. */
  function setTeam(id: number | null): void {
    if (id === teamId.value) return
    teamId.value = id
    members.items.value = []
    invitations.items.value = []
  }

  async function changeRole(userId: number, role: Role): Promise<void> {
    await changeMemberRole(requireTeam(), userId, role)
    await members.load()
  }

  async function remove(userId: number): Promise<void> {
    await removeMember(requireTeam(), userId)
    await members.load()
  }

  async function invite(input: NewInvitation): Promise<Invitation> {
    const invitation = await createInvitation(requireTeam(), input)
    await invitations.load()
    return invitation
  }

  async function resend(invitationId: number): Promise<void> {
    await resendInvitation(invitationId)
    await invitations.load()
  }

  async function revoke(invitationId: number): Promise<void> {
    await revokeInvitation(invitationId)
    await invitations.load()
  }

  return {
    teamId: readonly(teamId),
    members: members.items,
    isLoadingMembers: members.isLoading,
    membersError: members.error,
    loadMembers: members.load,
    invitations: invitations.items,
    isLoadingInvitations: invitations.isLoading,
    invitationsError: invitations.error,
    loadInvitations: invitations.load,
    setTeam,
    changeRole,
    remove,
    invite,
    resend,
    revoke,
  }
})
