/**
 * Debounced autosave with optimistic locking, for a proposal and for each scenario.
 *
 * Edits are merged into one pending patch and sent `delay` ms after the last edit, with the
 * version the page holds. One request at a time; edits made while it is in flight are sent
 * after it. On 409 (someone else saved first) saving stops, the server's explanation is kept
 * in `conflict`, and the unsent edits stay in `pending` — the form keeps them; the page offers
 * "reload their version" (`resolveConflict`) and then "apply my edits again". On 422 the
 * server's message is kept in `error` and the patch is dropped (the form shows the message);
 * on a network failure saving is retried after a pause.
 */
import type { ApiIssue } from './useApiError'

export type AutosaveStatus = 'idle' | 'pending' | 'saving' | 'saved' | 'error' | 'conflict' | 'offline'

export interface AutosaveOptions<Patch extends object> {
  /** ms after the last edit before saving. */
  delay: number
  /** Sends the patch with the version; resolves with the saved version. */
  send: (patch: Patch, version: number) => Promise<{ version: number }>
  /** The version the page holds now. */
  version: () => number
  /** Called with the server's answer after a save. */
  saved?: (version: number) => void
}

interface FetchFailure { status?: number, statusCode?: number, data?: { message?: string, issues?: ApiIssue[] } }

const RETRY_MS = 4000

export function useProposalAutosave<Patch extends object>(options: AutosaveOptions<Patch>) {
  const status = ref<AutosaveStatus>('idle')
  const pending = shallowRef<Patch | null>(null)
  const conflict = ref<string | null>(null)
  const error = ref<string | null>(null)
  const issues = ref<ApiIssue[]>([])
  const savedAt = ref<Date | null>(null)
  let inFlight: Promise<void> | null = null
  let timer: ReturnType<typeof setTimeout> | null = null

  function schedule(after = options.delay): void {
    if (timer) clearTimeout(timer)
    timer = setTimeout(() => {
      timer = null
      void flush()
    }, after)
  }

  /** Adds edits to the pending patch (later values win) and schedules a save. */
  function queue(patch: Patch): void {
    pending.value = { ...(pending.value ?? {}), ...patch } as Patch
    error.value = null
    issues.value = []
    if (conflict.value) return // stay put until the person resolves the conflict
    status.value = 'pending'
    schedule()
  }

  async function run(): Promise<void> {
    const patch = pending.value
    if (!patch || conflict.value) return
    pending.value = null
    status.value = 'saving'
    try {
      const answer = await options.send(patch, options.version())
      savedAt.value = new Date()
      options.saved?.(answer.version)
      status.value = pending.value ? 'pending' : 'saved'
    } catch (failure) {
      const { status: code, statusCode, data } = (failure ?? {}) as FetchFailure
      const http = code ?? statusCode ?? 0
      // Keep the unsent edits, merged under anything typed since.
      pending.value = { ...patch, ...(pending.value ?? {}) } as Patch
      if (http === 409) {
        conflict.value = data?.message ?? 'Someone else saved this after you opened it. Reload to see their changes; your edits are still in the form.'
        status.value = 'conflict'
      } else if (http === 422 || http === 400 || http === 413) {
        error.value = data?.message ?? 'The server did not accept this change.'
        issues.value = data?.issues ?? []
        pending.value = null
        status.value = 'error'
      } else if (http === 403 || http === 404) {
        error.value = data?.message ?? 'This proposal can no longer be changed here.'
        pending.value = null
        status.value = 'error'
      } else {
        error.value = 'Not saved yet: Tributary could not be reached. Trying again…'
        status.value = 'offline'
        schedule(RETRY_MS)
      }
    }
  }

  /** Sends what is pending now (and waits for any request in flight). */
  async function flush(): Promise<void> {
    if (timer) {
      clearTimeout(timer)
      timer = null
    }
    while (inFlight) await inFlight
    if (!pending.value || conflict.value) return
    inFlight = run().finally(() => {
      inFlight = null
    })
    await inFlight
    if (pending.value && !conflict.value && status.value === 'pending') schedule()
  }

  /**
   * After the page loaded the other person's version: forget the conflict and hand back the
   * edits that were not saved (the page may apply them again, which queues them anew).
   */
  function resolveConflict(): Patch | null {
    const mine = pending.value
    pending.value = null
    conflict.value = null
    error.value = null
    status.value = 'idle'
    return mine
  }

  /** Drops unsent edits (e.g. after the person discards them). */
  function discard(): void {
    if (timer) clearTimeout(timer)
    timer = null
    pending.value = null
    if (!conflict.value) status.value = 'idle'
  }

  onScopeDispose(() => {
    if (timer) clearTimeout(timer)
  })

  return { status, pending, conflict, error, issues, savedAt, queue, flush, resolveConflict, discard }
}
