/**
 * Live results of a proposal's scenarios, recomputed in the browser from the engine
 * (shared/proposals → shared/genetics) whenever a scenario's inputs, the recipient figures or
 * the outbreeding answers change — debounced, and only for the scenarios whose inputs changed
 * (a memo by their JSON). Exact-chain vectors come from useProposalExactChains; when one
 * arrives from the worker, the affected scenarios are recomputed.
 *
 * Each entry carries the time the computation took (`milliseconds`), shown to nobody but kept
 * on the results panel as data-compute-ms for the speed check in bench/ and the browser tests.
 */
import { computeScenarioResults } from '#shared/proposals'
import type { OutbreedingAnswerLike, RecipientFigures, ScenarioInputsLike, ScenarioResults } from '#shared/proposals'
import type { OutbreedingQuestion } from '#shared/genetics'

export interface ScenarioResultEntry {
  results: ScenarioResults | null
  /** Why there are no results (e.g. an input outside the engine's domain). */
  error: string | null
  milliseconds: number
  /** True while an exact-chain vector is still being computed for this scenario. */
  exactPending: boolean
}

export interface ResultSource {
  id: number
  /** Last valid inputs of the scenario (null: none yet). */
  inputs: ScenarioInputsLike | null
  /** The recipient figures with this scenario's overrides (null: a figure is missing). */
  recipient: RecipientFigures | null
  /** Why the recipient figures are missing, in words. */
  recipientProblem?: string
}

/** Delay after the last change before recomputing, ms. */
export const RESULTS_DEBOUNCE_MS = 120

export function useProposalResults(options: {
  scenarios: Ref<readonly ResultSource[]>
  answers: Ref<Partial<Record<OutbreedingQuestion, OutbreedingAnswerLike>> | null | undefined>
}) {
  const exact = useProposalExactChains()
  const entries = shallowRef(new Map<number, ScenarioResultEntry>())
  const memo = new Map<number, { key: string, entry: ScenarioResultEntry }>()
  const computing = ref(false)
  let timer: ReturnType<typeof setTimeout> | null = null

  function computeOne(source: ResultSource, recipient: RecipientFigures): ScenarioResultEntry {
    if (!source.inputs) return { results: null, error: 'These inputs are not complete yet.', milliseconds: 0, exactPending: false }
    const started = performance.now()
    try {
      const results = computeScenarioResults({ recipient, inputs: source.inputs, outbreedingAnswers: options.answers.value ?? null }, { exactVector: exact.provider })
      const exactPending = results.establishment.some(variant => variant.exact.status === 'pending')
      return { results, error: null, milliseconds: performance.now() - started, exactPending }
    } catch (error) {
      return { results: null, error: error instanceof Error ? error.message : String(error), milliseconds: performance.now() - started, exactPending: false }
    }
  }

  function recompute(force = false): void {
    timer = null
    const next = new Map<number, ScenarioResultEntry>()
    exact.beginPass()
    const answersKey = JSON.stringify(options.answers.value ?? null)
    for (const source of options.scenarios.value) {
      const recipient = source.recipient
      if (!recipient) {
        next.set(source.id, { results: null, error: source.recipientProblem ?? 'The recipient figures are incomplete.', milliseconds: 0, exactPending: false })
        continue
      }
      const key = `${JSON.stringify(recipient)}|${JSON.stringify(source.inputs)}|${answersKey}`
      const remembered = memo.get(source.id)
      if (!force && remembered && remembered.key === key && !remembered.entry.exactPending) {
        next.set(source.id, remembered.entry)
        continue
      }
      const entry = computeOne(source, recipient)
      memo.set(source.id, { key, entry })
      next.set(source.id, entry)
    }
    entries.value = next
    computing.value = false
  }

  function schedule(): void {
    computing.value = true
    if (timer) clearTimeout(timer)
    timer = setTimeout(() => recompute(), RESULTS_DEBOUNCE_MS)
  }

  if (import.meta.client) {
    // Nothing is computed before the page is mounted: the server renders no results, and a
    // change while hydrating must not make the first client render differ from the server's.
    let mounted = false
    onMounted(() => {
      mounted = true
      recompute()
    })
    watch([options.scenarios, options.answers], () => {
      if (mounted) schedule()
    }, { deep: true })
    // A vector arrived from the worker: recompute the scenarios that were waiting for it.
    watch(exact.revision, () => recompute())
  }
  onScopeDispose(() => {
    if (timer) clearTimeout(timer)
  })

  /** The entry of one scenario (undefined before the first computation). */
  function entryFor(id: number): ScenarioResultEntry | undefined {
    return entries.value.get(id)
  }

  return { entries, entryFor, computing, exactBusy: exact.busy, recomputeNow: () => recompute(true) }
}
