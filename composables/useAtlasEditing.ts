/**
 * Drawing and editing boundaries on the Atlas: the state the map and the bars read (draw mode,
 * the boundary being edited, its pending shape and problems) and the saves, through
 * PATCH /api/subpopulations/:id with the version the change is based on. A 409 (someone saved
 * in between) is explained and offers a reload. Boundaries are checked here with the same
 * rules as the server (shared/atlas/geometry-check.ts) before anything is sent.
 */
import { boundaryProblems } from '#shared/atlas/geometry-check'
import type { SubpopulationDto, SubpopulationGeometry } from '#shared/atlas/types'

export type AtlasDrawMode = 'polygon' | 'point'

export function useAtlasEditing(options: { refresh: () => Promise<void>, onNotice: (text: string) => void }) {
  const drawMode = ref<AtlasDrawMode | null>(null)
  /** 'new': the drawing becomes a new subpopulation; otherwise the id whose boundary it becomes. */
  const drawTarget = ref<'new' | SubpopulationDto | null>(null)
  const editing = ref<SubpopulationDto | null>(null)
  const pending = ref<SubpopulationGeometry | null>(null)
  const problems = ref<string[]>([])
  const saving = ref(false)
  const failure = useApiError()
  /** A finished drawing for a new subpopulation, waiting for its attributes. */
  const newGeometry = ref<SubpopulationGeometry | null>(null)

  const editingId = computed(() => editing.value?.id ?? null)
  const conflict = computed(() => failure.status.value === 409)

  function reset(): void {
    drawMode.value = null
    drawTarget.value = null
    editing.value = null
    pending.value = null
    problems.value = []
    failure.clear()
  }

  function startNew(mode: AtlasDrawMode): void {
    reset()
    drawTarget.value = 'new'
    drawMode.value = mode
  }

  function startDrawBoundary(item: SubpopulationDto): void {
    reset()
    drawTarget.value = item
    drawMode.value = 'polygon'
  }

  function startEdit(item: SubpopulationDto): void {
    reset()
    editing.value = item
  }

  function onDrawCancelled(): void {
    if (drawMode.value) reset()
  }

  async function saveBoundary(item: SubpopulationDto, geometry: SubpopulationGeometry | null, done: string): Promise<boolean> {
    problems.value = geometry ? boundaryProblems(geometry) : []
    if (problems.value.length) return false
    saving.value = true
    failure.clear()
    try {
      await $fetch(`/api/subpopulations/${item.id}`, { method: 'PATCH', body: { geometry, version: item.version } })
      options.onNotice(done)
      await options.refresh()
      return true
    } catch (error) {
      await failure.capture(error)
      problems.value = failure.fieldError('geometry') ? [failure.fieldError('geometry') as string] : []
      return false
    } finally {
      saving.value = false
    }
  }

  async function onDrawn(geometry: SubpopulationGeometry): Promise<void> {
    const target = drawTarget.value
    drawMode.value = null
    problems.value = boundaryProblems(geometry)
    if (problems.value.length) return
    if (target === 'new') {
      drawTarget.value = null
      newGeometry.value = geometry
      return
    }
    if (target && await saveBoundary(target, geometry, `The boundary of ${target.name} was saved.`)) reset()
  }

  function onEditChange(geometry: SubpopulationGeometry): void {
    pending.value = geometry
    problems.value = boundaryProblems(geometry)
  }

  async function saveEdit(): Promise<void> {
    const item = editing.value
    if (!item) return
    if (!pending.value) {
      reset()
      return
    }
    if (await saveBoundary(item, pending.value, `The boundary of ${item.name} was saved.`)) reset()
  }

  async function removeBoundary(item: SubpopulationDto): Promise<void> {
    reset()
    await saveBoundary(item, null, `${item.name} was taken off the map; its record is kept.`)
  }

  async function reloadAfterConflict(): Promise<void> {
    reset()
    await options.refresh()
  }

  return {
    drawMode, drawTarget, editing, editingId, pending, problems, saving, failure, conflict, newGeometry,
    startNew, startDrawBoundary, startEdit, onDrawCancelled, onDrawn, onEditChange, saveEdit, removeBoundary, reloadAfterConflict, reset,
  }
}
