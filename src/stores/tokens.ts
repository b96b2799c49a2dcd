import { defineStore } from 'pinia'
import type { CreatedToken, NewToken } from '../../shared/api'
import { createToken, listTokens, revokeToken } from '../api/tokens'
import { useLoadedList } from '../composables/useLoadedList'

/** The signed-in person's personal API tokens. Secrets are never kept here: the dialog holds the one just made. */
export const useTokensStore = defineStore('tokens', () => {
  const { items, isLoading, error, load } = useLoadedList(() => listTokens())

  /** Creates a token and reloads the list; throws the ApiRequestError so the dialog can show it. */
  async function create(input: NewToken): Promise<CreatedToken> {
    const created = await createToken(input)
    await load()
    return created
  }

  /** Revokes a token and reloads the list (it shows as revoked); throws the ApiRequestError for the confirm dialog. */
  async function revoke(tokenId: number): Promise<void> {
    await revokeToken(tokenId)
    await load()
  }

  return { items, isLoading, error, load, create, revoke }
})
