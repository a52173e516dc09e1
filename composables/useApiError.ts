/**
 * Turns a failed request (or a failed client-side zod check) into what a form
 * shows: one readable `message` for the alert at the top and `fieldErrors`
 * keyed by field path for the messages beside the inputs.
 *
 * The server answers errors as `{ message, issues?: [{ path, message }] }`
 * (status 400/401/403/404/409/413/422/429/500). A 401 outside the sign-in
 * forms means the session ended (signed out elsewhere, role changed,
 * deactivated): we clear the local session and go to the sign-in page.
 */
export interface ApiIssue {
  path: string | ReadonlyArray<PropertyKey>
  message: string
}

export interface CaptureOptions {
  /** Message for a 409 (someone else saved first). */
  conflict?: string
  /** Treat 401 as a plain message (sign-in, token pages) instead of "session ended". */
  unauthorizedIsMessage?: boolean
  /**
   * Field paths the form shows. Issues on other paths (or all issues, for a form
   * without fields) are written into the alert instead, so none goes unseen.
   */
  fields?: readonly string[]
}

const FALLBACK = 'Something went wrong on our side. Please try again in a moment.'
const OFFLINE = 'We could not reach Tributary. Check your connection and try again.'

/** Joins a zod-style path (['members', 0, 'email']) into 'members.0.email'. */
export function issuePath(path: ApiIssue['path']): string {
  return typeof path === 'string' ? path : path.map(part => String(part)).join('.')
}

interface ErrorLike {
  status?: number
  statusCode?: number
  data?: unknown
  message?: string
}

function readBody(data: unknown): { message?: string, issues?: ApiIssue[] } {
  if (!data || typeof data !== 'object') return {}
  const body = data as Record<string, unknown>
  const nested = body.data && typeof body.data === 'object' ? (body.data as Record<string, unknown>) : {}
  const issues = (Array.isArray(body.issues) ? body.issues : Array.isArray(nested.issues) ? nested.issues : undefined) as ApiIssue[] | undefined
  const message = typeof body.message === 'string' ? body.message : typeof body.statusMessage === 'string' ? body.statusMessage : undefined
  return { message, issues }
}

export function useApiError() {
  const message = ref<string | null>(null)
  const fieldErrors = ref<Record<string, string>>({})
  const status = ref<number | null>(null)
  const session = useUserSession()
  const route = useRoute()

  function clear(): void {
    message.value = null
    fieldErrors.value = {}
    status.value = null
  }

  /** Shows issues beside their fields; the first issue per field wins. */
  function setIssues(issues: readonly ApiIssue[], summary = 'Please correct the highlighted fields.'): void {
    const byField: Record<string, string> = {}
    for (const issue of issues) {
      const key = issuePath(issue.path) || '_form'
      byField[key] ??= issue.message
    }
    fieldErrors.value = byField
    message.value = summary
  }

  /** Reads a $fetch error and fills `message`, `fieldErrors` and `status`. */
  async function capture(error: unknown, options: CaptureOptions = {}): Promise<void> {
    const failure = (error ?? {}) as ErrorLike
    const code = failure.status ?? failure.statusCode ?? 0
    const body = readBody(failure.data)
    status.value = code
    fieldErrors.value = {}

    if (code === 401 && !options.unauthorizedIsMessage) {
      message.value = 'Your session has ended. Please sign in again.'
      await session.clear().catch(() => undefined)
      clearNuxtData('current-user')
      await navigateTo({ path: '/login', query: { redirect: route.fullPath, ended: '1' } })
      return
    }
    if (code === 409 && options.conflict) {
      message.value = options.conflict
      return
    }
    if (body.issues?.length) {
      const unplaced = body.issues.filter(issue => !issuePath(issue.path) || (options.fields && !options.fields.includes(issuePath(issue.path))))
      setIssues(body.issues, unplaced.length ? unplaced.map(issue => issue.message).join(' ') : 'Please correct the highlighted fields.')
      return
    }
    // 5xx: never echo what a proxy or framework put in the body; our server says the same sentence anyway.
    message.value = code === 0 ? OFFLINE : code >= 500 ? FALLBACK : (body.message ?? FALLBACK)
  }

  function fieldError(path: string): string | undefined {
    return fieldErrors.value[path]
  }

  return { message, fieldErrors, status, clear, setIssues, capture, fieldError }
}
