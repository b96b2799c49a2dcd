import {
  invitationListSchema,
  invitationLookupSchema,
  invitationSchema,
  memberListSchema,
  memberSchema,
  sessionInfoSchema,
  type AcceptInvitation,
  type Invitation,
  type InvitationLookup,
  type Member,
  type NewInvitation,
  type Role,
  type SessionInfo,
} from '../../shared/api'
import { request, setCsrfToken } from './http'

/** The team's members, owners first. */
export async function listMembers(teamId: number, signal?: AbortSignal): Promise<Member[]> {
  return (await request(`/teams/${teamId}/members`, { schema: memberListSchema, signal })).items
}

/** Gives a member another role (owners only; the last owner cannot be demoted). */
export function changeMemberRole(teamId: number, userId: number, role: Role): Promise<Member> {
  return request(`/teams/${teamId}/members/${userId}`, { method: 'PATCH', body: { role }, schema: memberSchema })
}

/** Removes a member, or leaves the team when `userId` is one's own. */
export function removeMember(teamId: number, userId: number): Promise<void> {
  return request(`/teams/${teamId}/members/${userId}`, { method: 'DELETE' })
}

/** The team's open invitations, newest first (owners only). */
export async function listInvitations(teamId: number, signal?: AbortSignal): Promise<Invitation[]> {
  return (await request(`/teams/${teamId}/invitations`, { schema: invitationListSchema, signal })).items
}

/** Invites an address; the server mails the link. */
export function createInvitation(teamId: number, input: NewInvitation): Promise<Invitation> {
  return request(`/teams/${teamId}/invitations`, { method: 'POST', body: input, schema: invitationSchema })
}

/** Mails an invitation again with a new link and a new expiry. */
export function resendInvitation(invitationId: number): Promise<Invitation> {
  return request(`/invitations/${invitationId}/resend`, { method: 'POST', schema: invitationSchema })
}

/** Revokes an invitation; its link stops working. */
export function revokeInvitation(invitationId: number): Promise<void> {
  return request(`/invitations/${invitationId}`, { method: 'DELETE' })
}

/** What an invitation link offers (public); 404 `invalid_invitation` for a link that does not work. */
export function lookupInvitation(token: string): Promise<InvitationLookup> {
  return request('/invitations/lookup', { query: { token }, schema: invitationLookupSchema, reportUnauthenticated: false })
}

/** Accepts an invitation; a new account is signed in by the answer, whose CSRF token is kept. */
export async function acceptInvitation(input: AcceptInvitation): Promise<SessionInfo> {
  const session = await request('/invitations/accept', { method: 'POST', body: input, schema: sessionInfoSchema, reportUnauthenticated: false })
  if (session.csrfToken) setCsrfToken(session.csrfToken)
  return session
}
