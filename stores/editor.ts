import { defineStore } from 'pinia'
import { buildPlate, defaultParams, paramIssues, plateParamsSchema, type Plate, type PlateParams, type ParamIssue } from '~~/geometry/core'
import { preparePreview, previewPlate } from '~~/geometry/preview'

/** What is selected on the canvas or in the findings list. */
export type Selection =
  | { kind: 'lobe'; index: number }
  | { kind: 'pocket'; index: number }
  | { kind: 'finding'; index: number }

export interface BaseRevision { id: string; number: number }

export interface ConflictInfo {
  latest: { id: string; number: number; note: string; createdAt: string; author: { id: string | null; name: string | null } }
  note: string
}

const HISTORY_LIMIT = 200

/** A deep copy of plain data (objects, arrays, numbers, strings, booleans, null), as params are. */
function copyPlain<T>(v: T): T {
  if (Array.isArray(v)) return v.map(copyPlain) as T
  if (v !== null && typeof v === 'object') {
    const out: Record<string, unknown> = {}
    for (const k of Object.keys(v)) out[k] = copyPlain((v as Record<string, unknown>)[k])
    return out as T
  }
  return v
}

/** Params are plain data: a hand copy takes a tenth of structuredClone's time, and a drag copies them on every move. */
function clone(p: PlateParams): PlateParams {
  return copyPlain(toRaw(p))
}

function same(a: PlateParams, b: PlateParams): boolean {
  return JSON.stringify(a) === JSON.stringify(b)
}

/** Params read from a stored revision; anything unreadable falls back to the defaults with a message. */
export function readParams(stored: unknown): { params: PlateParams; problem: string | null } {
  const parsed = plateParamsSchema.safeParse(stored)
  if (parsed.success) return { params: parsed.data, problem: null }
  return { params: defaultParams(), problem: `This revision's parameters could not be read (${parsed.error.issues[0]?.message ?? 'invalid'}); the defaults are shown instead.` }
}

/**
 * The design editor's state: the params being shaped, undo and redo over
 * them (a drag is one step), the selection, the revision the work started
 * from, and what saving answered.
 */
export const useEditorStore = defineStore('editor', () => {
  const designId = ref<string | null>(null)
  const base = ref<BaseRevision | null>(null)
  // Whole params objects are swapped, never changed in place: shallow refs keep
  // buildPlate off Vue's proxies, which cost more than the geometry itself.
  const params = shallowRef<PlateParams>(defaultParams())
  const saved = shallowRef<PlateParams>(defaultParams())
  const past = shallowRef<PlateParams[]>([])
  const future = shallowRef<PlateParams[]>([])
  const selection = ref<Selection | null>(null)
  const dragStart = shallowRef<PlateParams | null>(null)
  const saving = ref(false)
  const saveError = ref<string | null>(null)
  const conflict = ref<ConflictInfo | null>(null)
  const loadProblem = ref<string | null>(null)

  // During a drag the whole plate (findings, figures) and everything shown from it stay at
  // the drag's start; only the canvas follows the pointer, through `livePlate`.
  const frozen = shallowRef<PlateParams | null>(null)
  const settledParams = computed(() => frozen.value ?? params.value)
  const dragging = computed(() => frozen.value !== null)

  /** Chord tolerance of a drag's outline, mm: the drawing sets it to a screen pixel at its zoom. */
  const previewTolerance = ref(0.5)

  // The last plate that could be built: a half-made value never blanks the canvas.
  let lastPlate: Plate | null = null
  const plate = computed<Plate>(() => {
    try {
      lastPlate = buildPlate(settledParams.value)
    }
    catch (err: unknown) {
      if (!lastPlate) throw err
    }
    return lastPlate!
  })
  /** What the canvas draws: the whole plate, or while dragging the outline and holes of this pointer move. */
  const livePlate = computed<Plate>(() => {
    if (!frozen.value) return plate.value
    try {
      const started = performance.now()
      const preview = previewPlate(params.value, plate.value, { tolerance: previewTolerance.value })
      // The geometry's share of a pointer move, printed by the canvas bench.
      performance.measure('rootplate:preview', { start: started })
      return preview
    }
    catch {
      return plate.value
    }
  })
  const issues = computed<ParamIssue[]>(() => paramIssues(settledParams.value))
  // Read from the settled params: a drag is compared with what was saved once, when it ends, not on every pointer move.
  const dirty = computed(() => !same(settledParams.value, saved.value))
  const canUndo = computed(() => past.value.length > 0)
  const canRedo = computed(() => future.value.length > 0)

  function load(id: string, revision: BaseRevision & { params: unknown }) {
    const read = readParams(revision.params)
    designId.value = id
    base.value = { id: revision.id, number: revision.number }
    params.value = read.params
    frozen.value = null
    dragStart.value = null
    saved.value = clone(read.params)
    loadProblem.value = read.problem
    past.value = []
    future.value = []
    selection.value = null
    conflict.value = null
    saveError.value = null
  }

  /** Forgets the design, so the next visit loads it afresh. */
  function close() {
    designId.value = null
    base.value = null
    conflict.value = null
    selection.value = null
  }

  function record(previous: PlateParams) {
    past.value = [...past.value.slice(-(HISTORY_LIMIT - 1)), previous]
    future.value = []
  }

  /** One undoable change. */
  function update(change: (draft: PlateParams) => void) {
    const before = clone(params.value)
    const next = clone(params.value)
    change(next)
    if (same(before, next)) return
    params.value = next
    record(before)
  }

  function replace(next: PlateParams) {
    update((draft) => { Object.assign(draft, clone(next)) })
  }

  function beginDrag() {
    dragStart.value = clone(params.value)
    frozen.value = params.value
    preparePreview(plate.value, { tolerance: previewTolerance.value })
  }

  /** Moves during a drag change the params without adding history steps. */
  function dragTo(change: (draft: PlateParams) => void) {
    const next = clone(params.value)
    change(next)
    params.value = next
  }

  function endDrag() {
    const start = dragStart.value
    dragStart.value = null
    frozen.value = null
    if (start && !same(start, params.value)) record(start)
  }

  function undo() {
    const previous = past.value.at(-1)
    if (!previous) return
    past.value = past.value.slice(0, -1)
    future.value = [...future.value, clone(params.value)]
    params.value = previous
  }

  function redo() {
    const next = future.value.at(-1)
    if (!next) return
    future.value = future.value.slice(0, -1)
    past.value = [...past.value, clone(params.value)]
    params.value = next
  }

  function select(next: Selection | null) {
    selection.value = next
  }

  /**
   * Saves the params as a new revision on top of `base`. On 409 the conflict
   * is kept for the page to offer: reload theirs, or save ours on top.
   */
  async function save(note: string, onTopOf?: number): Promise<boolean> {
    if (!designId.value || !base.value) return false
    saving.value = true
    saveError.value = null
    try {
      const revision = await $fetch<{ id: string; number: number }>(`/api/designs/${designId.value}/revisions`, {
        method: 'POST',
        body: { params: params.value, note, basedOn: onTopOf ?? base.value.number },
      })
      base.value = { id: revision.id, number: revision.number }
      saved.value = clone(params.value)
      conflict.value = null
      return true
    }
    catch (err: unknown) {
      const e = errorInfo(err)
      if (e.status === 409) {
        conflict.value = { latest: (e.data as { latest: ConflictInfo['latest'] }).latest, note }
      }
      else if (e.status === 503 || e.status === undefined) {
        // The params stay as they are: the person saves again once the server answers.
        saveError.value = `${e.status === 503 ? DATABASE_AWAY_MESSAGE : 'Rootplate cannot be reached; your unsaved changes are kept in this tab.'} Save again once it is back.`
      }
      else {
        saveError.value = e.message
      }
      return false
    }
    finally {
      saving.value = false
    }
  }

  /** Saves ours on top of the revision that won the race. */
  async function saveOnTop(): Promise<boolean> {
    if (!conflict.value) return false
    const { latest, note } = conflict.value
    return save(note, latest.number)
  }

  /** Drops our changes and takes the revision that won the race. */
  async function reloadLatest(): Promise<void> {
    if (!conflict.value || !designId.value) return
    const latest = await $fetch<{ id: string; number: number; params: unknown }>(`/api/revisions/${conflict.value.latest.id}`)
    load(designId.value, latest)
  }

  return {
    designId, base, params, saved, selection, previewTolerance, saving, saveError, conflict, loadProblem,
    plate, livePlate, settledParams, dragging, issues, dirty, canUndo, canRedo,
    load, close, update, replace, beginDrag, dragTo, endDrag, undo, redo, select, save, saveOnTop, reloadLatest,
  }
})
