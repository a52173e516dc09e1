/**
 * Reads the one-time token of an e-mailed link (/invite?token=…,
 * /reset-password?token=…) and asks the server what it is for
 * (GET /api/auth/tokens/:token). `problem` says why the link cannot be used:
 * missing token, unknown (404), used or expired (410), or a link of the other
 * kind (an invitation opened on the reset page).
 */
import type { TokenInfoResponse } from '#shared/types/api'

export type LinkTokenInfo = TokenInfoResponse

export type LinkTokenProblem = 'missing' | 'unknown' | 'spent' | 'wrong-kind' | 'failed'

export function useLinkToken(purpose: LinkTokenInfo['purpose']) {
  const route = useRoute()
  const token = computed(() => {
    const value = Array.isArray(route.query.token) ? route.query.token[0] : route.query.token
    return typeof value === 'string' ? value.trim() : ''
  })
  const request = useRequestFetch()

  const lookup = useAsyncData<LinkTokenInfo | null>(`link-token-${purpose}`, async () => {
    if (!token.value) return null
    return await request<LinkTokenInfo>(`/api/auth/tokens/${encodeURIComponent(token.value)}`)
  }, { watch: [token], default: () => null })

  const problem = computed<LinkTokenProblem | null>(() => {
    if (!token.value) return 'missing'
    const failure = lookup.error.value
    if (failure) {
      const code = failure.statusCode ?? 0
      if (code === 404) return 'unknown'
      if (code === 410) return 'spent'
      return 'failed'
    }
    const info = lookup.data.value
    if (info && info.purpose !== purpose) return 'wrong-kind'
    return null
  })

  return { token, info: lookup.data, pending: lookup.status, problem, refresh: lookup.refresh }
}
