import { createdTokenSchema, tokenListSchema, type CreatedToken, type NewToken, type Token } from '../../shared/api'
import { request } from './http'

/** The signed-in person's personal API tokens, newest first, without secrets. */
export async function listTokens(signal?: AbortSignal): Promise<Token[]> {
  const result = await request('/tokens', { schema: tokenListSchema, signal })
  return result.items
}

/** Creates a token; the answer carries the secret, which the server never shows again. */
export function createToken(input: NewToken): Promise<CreatedToken> {
  return request('/tokens', { method: 'POST', body: input, schema: createdTokenSchema })
}

/** Revokes one of the person's tokens; requests made with it are refused from then on. */
export function revokeToken(tokenId: number): Promise<void> {
  return request(`/tokens/${tokenId}`, { method: 'DELETE' })
}
