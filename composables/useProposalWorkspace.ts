/**
 * State of the proposal workspace (pages/proposals/[id]/index.vue and compare.vue): the
 * proposal as loaded (GET /api/proposals/:id), the editable proposal fields and scenario drafts,
 * their autosaves (PATCH with version, 409 kept with the server's explanation), adding,
 * duplicating and deleting scenarios, and the live results of every scenario.
 *
 * Scenario drafts are edited as whole `inputs` objects; each change is checked with the shared
 * ScenarioInputsSchema. Valid inputs are saved and computed; invalid ones show their messages
 * beside the fields while the results keep the last valid inputs.
 */
import type { OutbreedingQuestion } from '#shared/genetics'
import { resolveRecipient } from '#shared/proposals'
import type { RecipientFigures, ResolvedRecipient } from '#shared/proposals'
import type {
  ChecklistEntry, Narrative, OutbreedingAnswer, OutbreedingAnswers, ProposalDetailResponse, ProposalDto, ProposalPatchInput,
} from '#shared/schemas/proposal'
import { defaultScenarioInputs, FIRST_SCENARIO_NAME, ScenarioInputsSchema } from '#shared/schemas/scenario'
import type { ScenarioDto, ScenarioInputs } from '#shared/schemas/scenario'
import type { ResultSource } from './useProposalResults'

/** Roles that may edit proposals (the server checks this too). */
export const PROPOSAL_EDITOR_ROLES = ['biologist', 'manager', 'administrator'] as const

/** Proposal fields the workspace edits, as they are sent in a PATCH (without version). */
export type ProposalEdits = Omit<ProposalPatchInput, 'version'>

/** What a scenario PATCH carries (without version). */
export interface ScenarioEdits { name?: string, inputs?: ScenarioInputs }

/** One scenario as the workspace holds it. */
export interface ScenarioDraft {
  id: number
  name: string
  isBaseline: boolean
  version: number
  /** What the form shows (may be invalid while typing). */
  inputs: ScenarioInputs
  /** The last inputs that passed the schema (computed and saved). */
  validInputs: ScenarioInputs | null
  /** Schema messages by path ('schedule.males', 'variants.0.sRange', …). */
  errors: Record<string, string>
}

function clone<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T
}

/** Checks a draft with the shared schema; messages keyed by their dotted path. */
export function checkScenarioInputs(inputs: unknown): { valid: ScenarioInputs | null, errors: Record<string, string> } {
  const parsed = ScenarioInputsSchema.safeParse(inputs)
  if (parsed.success) return { valid: parsed.data, errors: {} }
  const errors: Record<string, string> = {}
  for (const issue of parsed.error.issues) {
    const key = issue.path.map(part => String(part)).join('.') || '_form'
    errors[key] ??= issue.message
  }
  return { valid: null, errors }
}

/** The next free "Scenario X" name. */
export function nextScenarioName(existing: readonly string[]): string {
  for (let index = 0; index < 26; index++) {
    const name = `Scenario ${String.fromCharCode(65 + index)}`
    if (!existing.includes(name)) return name
  }
  return `Scenario ${existing.length + 1}`
}

/**
 * @param id - the proposal id (from the route)
 * @param page - which page asks ('workspace' | 'compare'): each keeps its own copy of the
 *   answer, so opening one from the other always loads the proposal as it is now
 */
export function useProposalWorkspace(id: Ref<number>, page: 'workspace' | 'compare' = 'workspace') {
  const { user } = useUserSession()
  const request = useFetch<ProposalDetailResponse>(() => `/api/proposals/${id.value}`, {
    key: `proposal-${id.value}-${page}`,
  })
  const { data: detail, error: loadError, refresh, status: loadStatus } = request

  const proposal = ref<ProposalDto | null>(null)
  const version = ref(0)
  const lastSaved = ref<ProposalDetailResponse['lastSaved']>(null)
  const scenarios = ref<ScenarioDraft[]>([])
  const scopes = new Map<number, { scope: ReturnType<typeof effectScope>, autosave: ReturnType<typeof useProposalAutosave<ScenarioEdits>> }>()
  const actionError = ref<string | null>(null)
  const busy = ref<string | null>(null)
  /** Ticks when a scenario's autosave is created or dropped (`scopes` itself is not reactive). */
  const autosaveRevision = ref(0)

  const canEdit = computed(() => Boolean(proposal.value?.editable) && (PROPOSAL_EDITOR_ROLES as readonly string[]).includes(user.value?.role ?? ''))

  // ---- proposal fields --------------------------------------------------------------------
  const proposalAutosave = useProposalAutosave<ProposalEdits>({
    delay: 800,
    version: () => version.value,
    send: async (patch, current) => {
      const answer = await $fetch<ProposalDetailResponse>(`/api/proposals/${id.value}`, { method: 'PATCH', body: { ...patch, version: current } })
      version.value = answer.proposal.version
      lastSaved.value = answer.lastSaved
      if (proposal.value) {
        // The server may re-derive the screen (sources changed) and owns status/editable.
        proposal.value = {
          ...proposal.value,
          version: answer.proposal.version,
          status: answer.proposal.status,
          editable: answer.proposal.editable,
          updatedAt: answer.proposal.updatedAt,
          outbreedingAnswers: proposalAutosave.pending.value?.outbreedingAnswers ? proposal.value.outbreedingAnswers : answer.proposal.outbreedingAnswers,
        }
      }
      if (detail.value) detail.value = { ...detail.value, sources: answer.sources, recipient: answer.recipient }
      return { version: answer.proposal.version }
    },
  })

  /** Applies edits to the form at once and queues them for saving. */
  function editProposal(edits: ProposalEdits): void {
    if (!proposal.value || !canEdit.value) return
    const next = { ...proposal.value }
    if (edits.title !== undefined) next.title = edits.title
    if (edits.purpose !== undefined) next.purpose = edits.purpose
    if (edits.sourceSubpopulationIds !== undefined) next.sourceSubpopulationIds = [...edits.sourceSubpopulationIds]
    if (edits.captiveSource !== undefined) next.captiveSource = edits.captiveSource ?? null
    if (edits.recommendedScenarioId !== undefined) next.recommendedScenarioId = edits.recommendedScenarioId ?? null
    if (edits.narrative) next.narrative = { ...next.narrative, ...edits.narrative } as Narrative
    if (edits.outbreedingAnswers) next.outbreedingAnswers = { ...next.outbreedingAnswers, ...edits.outbreedingAnswers } as OutbreedingAnswers
    if (edits.checklist) next.checklist = { ...next.checklist, ...edits.checklist }
    proposal.value = next
    const queued: ProposalEdits = { ...edits }
    // Nested sections merge key by key on the server; keep every touched key in the pending patch.
    const pending = proposalAutosave.pending.value
    if (edits.narrative && pending?.narrative) queued.narrative = { ...pending.narrative, ...edits.narrative }
    if (edits.outbreedingAnswers && pending?.outbreedingAnswers) queued.outbreedingAnswers = { ...pending.outbreedingAnswers, ...edits.outbreedingAnswers }
    if (edits.checklist && pending?.checklist) queued.checklist = { ...pending.checklist, ...edits.checklist }
    proposalAutosave.queue(queued)
  }

  function editNarrative(key: keyof Narrative, value: string): void {
    editProposal({ narrative: { [key]: value } })
  }
  function editAnswer(question: OutbreedingQuestion, answer: OutbreedingAnswer): void {
    editProposal({ outbreedingAnswers: { [question]: answer } })
  }
  function editChecklist(item: string, entry: ChecklistEntry): void {
    editProposal({ checklist: { [item]: entry } as ProposalEdits['checklist'] })
  }

  // ---- scenarios ----------------------------------------------------------------------------
  function draftFrom(dto: ScenarioDto): ScenarioDraft {
    const inputs = clone(dto.inputs)
    return { id: dto.id, name: dto.name, isBaseline: dto.isBaseline, version: dto.version, inputs, validInputs: clone(dto.inputs), errors: {} }
  }

  function scenarioAutosave(scenarioId: number) {
    const existing = scopes.get(scenarioId)
    if (existing) return existing.autosave
    const scope = effectScope(true)
    const autosave = scope.run(() => useProposalAutosave<ScenarioEdits>({
      delay: 700,
      version: () => scenarios.value.find(item => item.id === scenarioId)?.version ?? 0,
      send: async (patch, current) => {
        const answer = await $fetch<ScenarioDto>(`/api/scenarios/${scenarioId}`, { method: 'PATCH', body: { ...patch, version: current } })
        const draft = scenarios.value.find(item => item.id === scenarioId)
        if (draft) draft.version = answer.version
        return { version: answer.version }
      },
    }))!
    scopes.set(scenarioId, { scope, autosave })
    autosaveRevision.value++
    return autosave
  }

  function forgetScenario(scenarioId: number): void {
    scopes.get(scenarioId)?.scope.stop()
    scopes.delete(scenarioId)
    autosaveRevision.value++
  }

  /** Replaces a scenario's inputs in the form; valid inputs are computed and saved. */
  function editScenarioInputs(scenarioId: number, inputs: ScenarioInputs): void {
    const draft = scenarios.value.find(item => item.id === scenarioId)
    if (!draft || !canEdit.value) return
    draft.inputs = inputs
    const { valid, errors } = checkScenarioInputs(inputs)
    draft.errors = errors
    if (!valid) return
    draft.validInputs = valid
    scenarioAutosave(scenarioId).queue({ inputs: valid })
  }

  function renameScenario(scenarioId: number, name: string): void {
    const draft = scenarios.value.find(item => item.id === scenarioId)
    if (!draft || !canEdit.value || draft.isBaseline) return
    draft.name = name
    const trimmed = name.trim()
    if (trimmed.length === 0) {
      draft.errors = { ...draft.errors, name: 'Enter a name.' }
      return
    }
    const { name: _dropped, ...rest } = draft.errors
    draft.errors = rest
    scenarioAutosave(scenarioId).queue({ name: trimmed })
  }

  async function createScenario(name: string, inputs: ScenarioInputs): Promise<ScenarioDraft | null> {
    actionError.value = null
    try {
      const created = await $fetch<ScenarioDto>(`/api/proposals/${id.value}/scenarios`, { method: 'POST', body: { name, inputs } })
      const draft = draftFrom(created)
      scenarios.value = [...scenarios.value, draft]
      return draft
    } catch (failure) {
      actionError.value = proposalErrorMessage(failure, 'The scenario could not be added.')
      return null
    }
  }

  async function addScenario(): Promise<ScenarioDraft | null> {
    busy.value = 'add'
    try {
      const source = proposal.value?.sourceSubpopulationIds[0] ?? null
      return await createScenario(nextScenarioName(scenarios.value.map(item => item.name)), defaultScenarioInputs(source))
    } finally {
      busy.value = null
    }
  }

  async function duplicateScenario(scenarioId: number): Promise<ScenarioDraft | null> {
    const draft = scenarios.value.find(item => item.id === scenarioId)
    if (!draft) return null
    busy.value = `duplicate-${scenarioId}`
    try {
      const base = draft.validInputs ?? draft.inputs
      const inputs = draft.isBaseline ? defaultScenarioInputs(proposal.value?.sourceSubpopulationIds[0] ?? null) : clone(base)
      if (draft.isBaseline) inputs.horizonYears = base.horizonYears
      const name = draft.isBaseline ? nextScenarioName(scenarios.value.map(item => item.name)) : `${draft.name} (copy)`.slice(0, 120)
      return await createScenario(name, inputs)
    } finally {
      busy.value = null
    }
  }

  async function deleteScenario(scenarioId: number): Promise<boolean> {
    const draft = scenarios.value.find(item => item.id === scenarioId)
    if (!draft || draft.isBaseline) return false
    busy.value = `delete-${scenarioId}`
    actionError.value = null
    try {
      const autosave = scopes.get(scenarioId)?.autosave
      autosave?.discard()
      await $fetch(`/api/scenarios/${scenarioId}`, { method: 'DELETE', query: { version: draft.version } })
      forgetScenario(scenarioId)
      scenarios.value = scenarios.value.filter(item => item.id !== scenarioId)
      if (proposal.value?.recommendedScenarioId === scenarioId) proposal.value = { ...proposal.value, recommendedScenarioId: null }
      return true
    } catch (failure) {
      actionError.value = proposalErrorMessage(failure, 'The scenario could not be deleted.')
      return false
    } finally {
      busy.value = null
    }
  }

  // ---- loading and conflicts ----------------------------------------------------------------
  function adopt(answer: ProposalDetailResponse): void {
    proposal.value = clone(answer.proposal)
    version.value = answer.proposal.version
    lastSaved.value = answer.lastSaved
    for (const scenarioId of scopes.keys()) if (!answer.scenarios.some(item => item.id === scenarioId)) forgetScenario(scenarioId)
    scenarios.value = answer.scenarios.map(draftFrom)
  }

  /**
   * Resolves once the proposal is loaded and adopted. Pages `await` it, so the server renders
   * the workspace and a page opened by in-app navigation starts from a fresh answer (the data
   * of a key can still hold what another page loaded earlier).
   */
  const ready: Promise<void> = Promise.resolve(request).then(() => {
    if (detail.value) adopt(detail.value)
  })
  watch(detail, (answer) => {
    if (answer && proposal.value && proposal.value.id !== answer.proposal.id) adopt(answer)
  })

  /** Edits that were not saved when the conflict was resolved, kept for "apply my edits again". */
  const keptProposalEdits = shallowRef<ProposalEdits | null>(null)
  const keptScenarioEdits = shallowRef(new Map<number, ScenarioEdits>())

  /** Loads the version someone else saved; this person's unsaved edits are kept aside. */
  async function reloadTheirVersion(): Promise<void> {
    busy.value = 'reload'
    try {
      const answer = await $fetch<ProposalDetailResponse>(`/api/proposals/${id.value}`)
      const mine = proposalAutosave.resolveConflict()
      proposalAutosave.discard()
      keptProposalEdits.value = mine && Object.keys(mine).length ? mine : null
      const kept = new Map<number, ScenarioEdits>()
      for (const [scenarioId, entry] of scopes) {
        const edits = entry.autosave.resolveConflict()
        if (edits && Object.keys(edits).length) kept.set(scenarioId, edits)
      }
      keptScenarioEdits.value = kept
      adopt(answer)
      detail.value = answer
    } catch (failure) {
      actionError.value = proposalErrorMessage(failure, 'Their version could not be loaded.')
    } finally {
      busy.value = null
    }
  }

  /** Applies the kept edits on top of the version now loaded (and saves them). */
  function applyKeptEdits(): void {
    const edits = keptProposalEdits.value
    keptProposalEdits.value = null
    if (edits) editProposal(edits)
    for (const [scenarioId, scenarioEdits] of keptScenarioEdits.value) {
      if (scenarioEdits.inputs) editScenarioInputs(scenarioId, scenarioEdits.inputs)
      if (scenarioEdits.name) renameScenario(scenarioId, scenarioEdits.name)
    }
    keptScenarioEdits.value = new Map()
  }

  function discardKeptEdits(): void {
    keptProposalEdits.value = null
    keptScenarioEdits.value = new Map()
  }

  const hasKeptEdits = computed(() => Boolean(keptProposalEdits.value) || keptScenarioEdits.value.size > 0)

  /** The first conflict message among the proposal and its scenarios. */
  const conflict = computed(() => {
    void autosaveRevision.value
    if (proposalAutosave.conflict.value) return proposalAutosave.conflict.value
    for (const scenario of scenarios.value) {
      const message = scopes.get(scenario.id)?.autosave.conflict.value
      if (message) return message
    }
    return null
  })

  /** One status for the whole page: conflict > offline > error > saving > pending > saved. */
  const saveState = computed(() => {
    void autosaveRevision.value
    const states = [proposalAutosave.status.value, ...scenarios.value.map(item => scopes.get(item.id)?.autosave.status.value ?? 'idle')]
    for (const state of ['conflict', 'offline', 'error', 'saving', 'pending', 'saved'] as const) if (states.includes(state)) return state
    return 'idle' as const
  })
  const saveError = computed(() => {
    void autosaveRevision.value
    return proposalAutosave.error.value ?? scenarios.value.map(item => scopes.get(item.id)?.autosave.error.value).find(Boolean) ?? null
  })

  async function flushAll(): Promise<void> {
    await Promise.all([proposalAutosave.flush(), ...[...scopes.values()].map(entry => entry.autosave.flush())])
  }

  // ---- recipient figures and results --------------------------------------------------------
  const recipientRecord = computed(() => detail.value?.recipient ?? null)

  function recipientFor(inputs: ScenarioInputs | null): ResolvedRecipient | null {
    const record = recipientRecord.value
    if (!record) return null
    return resolveRecipient(record, inputs?.recipientOverrides)
  }

  const resultSources = computed<ResultSource[]>(() => scenarios.value.map((scenario) => {
    const resolved = recipientFor(scenario.validInputs)
    return {
      id: scenario.id,
      inputs: scenario.validInputs,
      recipient: resolved?.figures ?? null,
      recipientProblem: resolved?.problems.join(' '),
    }
  }))
  const answers = computed(() => proposal.value?.outbreedingAnswers ?? null)
  const results = useProposalResults({ scenarios: resultSources, answers })

  /** Record figures without overrides (for the inputs' placeholders). */
  const recordFigures = computed<RecipientFigures | null>(() => recipientFor(null)?.figures ?? null)

  if (import.meta.client) {
    const warn = (event: BeforeUnloadEvent) => {
      if (['pending', 'saving', 'offline', 'conflict'].includes(saveState.value)) event.preventDefault()
    }
    onMounted(() => window.addEventListener('beforeunload', warn))
    onBeforeUnmount(() => {
      window.removeEventListener('beforeunload', warn)
      void flushAll()
    })
  }
  onScopeDispose(() => {
    for (const entry of scopes.values()) entry.scope.stop()
    scopes.clear()
  })

  return {
    ready, detail, loadError, loadStatus, refresh,
    proposal, version, lastSaved, scenarios, canEdit,
    editProposal, editNarrative, editAnswer, editChecklist,
    editScenarioInputs, renameScenario, addScenario, duplicateScenario, deleteScenario,
    scenarioAutosave: (scenarioId: number) => scopes.get(scenarioId)?.autosave ?? null,
    proposalAutosave, conflict, saveState, saveError, flushAll,
    reloadTheirVersion, applyKeptEdits, discardKeptEdits, hasKeptEdits, keptProposalEdits,
    recipientRecord, recordFigures, recipientFor, results, actionError, busy,
    firstScenarioName: FIRST_SCENARIO_NAME,
  }
}

/** A readable message from a failed $fetch. */
export function proposalErrorMessage(failure: unknown, fallback: string): string {
  const data = (failure as { data?: { message?: string } } | null)?.data
  return typeof data?.message === 'string' ? data.message : fallback
}
