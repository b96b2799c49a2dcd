import {
  passwordResetAcceptedSchema,
  revokedSessionsSchema,
  sessionInfoSchema,
  type ChangePassword,
  type PasswordResetAccepted,
  type PasswordResetConfirm,
  type SessionInfo,
  type UpdateProfile,
} from '../../shared/api'
import { request, setCsrfToken } from './http'

/** Changes the signed-in person's display name; resolves to the session as it now is. */
export async function updateProfile(input: UpdateProfile): Promise<SessionInfo> {
  const session = await request('/auth/me', { method: 'PATCH', body: input, schema: sessionInfoSchema })
  setCsrfToken(session.csrfToken)
  return session
}

/** Sets a new password (the current one is required); the person's other sessions end. */
export function changePassword(input: ChangePassword): Promise<void> {
  return request('/auth/password', { method: 'POST', body: input })
}

/** Signs out every other session of the person; resolves to how many ended. */
export async function revokeOtherSessions(): Promise<number> {
  return (await request('/auth/sessions/revoke-others', { method: 'POST', schema: revokedSessionsSchema })).revoked
}

/** Asks for a reset link by mail; the answer is the same whether or not an account uses the address. */
export function requestPasswordReset(email: string): Promise<PasswordResetAccepted> {
  return request('/auth/password-reset', {
    method: 'POST', body: { email }, schema: passwordResetAcceptedSchema, withCsrf: false, reportUnauthenticated: false,
  })
}

/** Sets a new password with the token of a reset link. */
export function confirmPasswordReset(input: PasswordResetConfirm): Promise<void> {
  return request('/auth/password-reset/confirm', { method: 'POST', body: input, withCsrf: false, reportUnauthenticated: false })
}
