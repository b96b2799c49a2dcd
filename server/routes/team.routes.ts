import type { DataSource } from 'typeorm'
import { z } from 'zod'
import { sessionInfoSchema } from '../../shared/api/auth'
import { idParam } from '../../shared/api/common'
import {
  acceptInvitationSchema,
  invitationListSchema,
  invitationLookupQuerySchema,
  invitationLookupSchema,
  invitationSchema,
  memberListSchema,
  memberRoleSchema,
  memberSchema,
  newInvitationSchema,
  TEAM_LIMITS,
} from '../../shared/api/team'
import { forbidden } from '../errors/http-error'
import { roleAllows } from '../services/policy'
import { sessionInfo } from '../services/auth.service'
import * as invitations from '../services/invitations.service'
import * as members from '../services/members.service'
import type { Mailer } from '../services/mail.service'
import { recordActivity } from '../services/activity.service'
import type { ApiRegistry } from './api-route'
import { startSession } from './auth.routes'

const teamParams = z.object({ teamId: idParam })
const memberParams = z.object({ teamId: idParam, userId: idParam })
const invitationParams = z.object({ invitationId: idParam })
const manageTeam = { permission: 'team.manage', scope: 'team' } as const
const manageInvitation = { permission: 'team.manage', scope: 'invitation' } as const

/** Joining is logged here, not by the route layer: the team comes from the link, and a new account acts through it. */
async function recordJoined(ds: DataSource, accepted: invitations.AcceptedInvitation, via: 'session' | 'token' | undefined): Promise<void> {
  const { user, teamId, role, created } = accepted
  try {
    await recordActivity(ds, {
      teamId, projectId: null, actorId: user.id, actorName: user.displayName, via: created ? 'link' : (via ?? 'link'),
      action: 'joined', targetType: 'member', targetId: user.id, targetName: user.displayName,
      summary: `${user.displayName} joined the team as ${role}${created ? ', with a new account' : ''}.`,
    })
  } catch (err) {
    console.error('[rootcast] activity of POST /invitations/accept was not recorded:', err)
  }
}

/** Invitations by e-mail, the accept flow, and the team's members and their roles. */
export function teamRoutes(api: ApiRegistry, deps: { ds: DataSource; publicUrl: string; mailer?: Mailer }): void {
  const { ds } = deps

  api.add({
    method: 'get', path: '/teams/:teamId/invitations', tag: 'teams', summary: 'The team’s open invitations, newest first',
    access: manageTeam, params: teamParams, response: invitationListSchema,
    handler: async ({ params }) => ({ items: await invitations.listInvitations(ds, params.teamId) }),
  })

  api.add({
    method: 'post', path: '/teams/:teamId/invitations', tag: 'teams', summary: 'Invite an address by e-mail with a role',
    description: `Mails a single-use link that works for ${TEAM_LIMITS.invitationDays} days. An address already in the team is 409 \`already_member\`; an open invitation for the same address is revoked and replaced. A mail that cannot be sent is 502 \`mail_failed\` (the invitation stays).`,
    access: manageTeam, params: teamParams, body: newInvitationSchema, status: 201, response: invitationSchema, errors: [409, 502],
    activity: ({ result }) => ({ action: 'invited', targetType: 'invitation', targetId: result.id, targetName: result.email, summary: `Invited ${result.email} as ${result.role}.` }),
    handler: async ({ params, body, user }) => {
      const sent = await invitations.createInvitation(ds, { teamId: params.teamId, invitedById: user.id, email: body.email, role: body.role })
      await invitations.mailInvitation(ds, deps, sent, user)
      return sent.invitation
    },
  })

  api.add({
    method: 'post', path: '/invitations/:invitationId/resend', tag: 'teams', summary: 'Mail an invitation again with a new link and a new expiry',
    description: 'The link of the earlier mail stops working. An accepted or revoked invitation is 409 `invitation_closed`.',
    access: manageInvitation, params: invitationParams, response: invitationSchema, errors: [404, 409, 502],
    activity: ({ result }) => ({ action: 'resent', targetType: 'invitation', targetId: result.id, targetName: result.email, summary: `Resent the invitation to ${result.email}.` }),
    handler: async ({ params, user }) => {
      const sent = await invitations.resendInvitation(ds, params.invitationId)
      await invitations.mailInvitation(ds, deps, sent, user)
      return sent.invitation
    },
  })

  api.add({
    method: 'delete', path: '/invitations/:invitationId', tag: 'teams', summary: 'Revoke an invitation; its link stops working',
    description: 'Again is a no-op; an accepted invitation is 409 `invitation_closed`.',
    access: manageInvitation, params: invitationParams, status: 204, errors: [404, 409],
    activity: ({ params, scoped }) => ({ action: 'revoked', targetType: 'invitation', targetId: params.invitationId, targetName: scoped?.name ?? '', summary: `Revoked the invitation to ${scoped?.name ?? 'an address'}.` }),
    handler: async ({ params }) => invitations.revokeInvitation(ds, params.invitationId),
  })

  api.add({
    method: 'get', path: '/invitations/lookup', tag: 'teams', summary: 'What an invitation link offers: team, address, role and expiry',
    description: 'Public: the link’s secret is the credential. A link that is unknown, used, revoked or expired is 404 `invalid_invitation`, one answer for all four.',
    access: 'public', query: invitationLookupQuerySchema, response: invitationLookupSchema, errors: [404],
    handler: async ({ query }) => invitations.lookupInvitation(ds, query.token),
  })

  api.add({
    method: 'post', path: '/invitations/accept', tag: 'teams', summary: 'Accept an invitation: join the team, creating the account if needed',
    description:
      'Without an account for the address, `displayName` and `password` are required: the account is made and signed in on a fresh session. ' +
      'With one, the caller must be signed in as it, else 409 `sign_in_required`. The link works once (404 `invalid_invitation` afterwards). ' +
      'A caller with a session sends its CSRF token.',
    access: 'public', body: acceptInvitationSchema, response: sessionInfoSchema, errors: [404, 409],
    activity: { none: 'written by the handler: the team is known only once the link is checked' },
    handler: async ({ body, req }) => {
      // Public, so the route layer checks nothing: a session's CSRF token is checked here.
      if (req.auth?.via === 'session') req.auth.assertCsrf(req)
      const accepted = await invitations.acceptInvitation(ds, { secret: body.token, displayName: body.displayName, password: body.password }, req.auth?.user)
      await recordJoined(ds, accepted, req.auth?.via)
      if (accepted.created) return sessionInfo(ds, accepted.user, await startSession(req, accepted.user.id))
      return sessionInfo(ds, accepted.user, req.auth?.via === 'session' ? (req.session.csrfToken ?? '') : '')
    },
  })

  api.add({
    method: 'get', path: '/teams/:teamId/members', tag: 'teams', summary: 'The team’s members with role and last activity, owners first',
    access: { permission: 'team.read', scope: 'team' }, params: teamParams, response: memberListSchema,
    handler: async ({ params }) => ({ items: await members.listMembers(ds, params.teamId) }),
  })

  api.add({
    method: 'patch', path: '/teams/:teamId/members/:userId', tag: 'teams', summary: 'Change a member’s role',
    description: 'The last owner cannot be demoted: 409 `last_owner`.',
    access: manageTeam, params: memberParams, body: memberRoleSchema, response: memberSchema, errors: [404, 409],
    activity: ({ result }) => ({ action: 'changed', targetType: 'member', targetId: result.userId, targetName: result.displayName, summary: `Made ${result.displayName} ${result.role === 'owner' ? 'an' : 'a'} ${result.role}.` }),
    handler: async ({ params, body }) => members.changeMemberRole(ds, params.teamId, params.userId, body.role),
  })

  api.add({
    method: 'delete', path: '/teams/:teamId/members/:userId', tag: 'teams', summary: 'Remove a member, or leave the team (your own user id)',
    description: 'Owners remove anyone; every member may remove themselves. The last owner cannot go: 409 `last_owner`.',
    access: { permission: 'team.read', scope: 'team' }, params: memberParams, status: 204, errors: [404, 409],
    activity: ({ params, user, result }) => {
      const name = (result as unknown as members.RemovedMember).displayName
      const left = params.userId === user?.id
      return { action: 'removed', targetType: 'member', targetId: params.userId, targetName: name, summary: left ? `${name} left the team.` : `Removed ${name} from the team.` }
    },
    // The 204 sends no body; the removed member's name is handed to the activity log only.
    handler: async ({ params, user, role }) => {
      if (params.userId !== user.id && !(role && roleAllows(role, 'team.manage'))) throw forbidden()
      return members.removeMember(ds, params.teamId, params.userId)
    },
  })
}
