import type { AttachmentRow, ReferencePlacement, ReferenceRow } from '~/composables/useUploads'

export type ReferenceMode = 'view' | 'move' | 'calibrate'
type Point = { x: number; y: number }

function naturalSize(url: string): Promise<{ width: number; height: number }> {
  return new Promise((resolve, reject) => {
    const img = new Image()
    img.onload = () => resolve({ width: img.naturalWidth, height: img.naturalHeight })
    img.onerror = () => reject(new Error('The image could not be opened'))
    img.src = url
  })
}

/**
 * The reference image under the plate: its saved placement, a draft while it
 * is moved or turned, and the two-point calibration of its scale. Saved with
 * the design (PUT /api/designs/:id/reference), never with a revision.
 */
export function useReferenceEditor(designId: MaybeRefOrGetter<string>) {
  const { data, refresh } = useReference(designId)
  const draft = ref<ReferencePlacement | null>(null)
  const mode = ref<ReferenceMode>('view')
  const points = ref<Point[]>([])
  const saving = ref(false)
  const problem = ref('')
  const hidden = ref(false)

  watch(data, (d) => {
    draft.value = d ? { attachmentId: d.attachmentId, x: d.x, y: d.y, rotation: d.rotation, mmPerPixel: d.mmPerPixel, opacity: d.opacity } : null
  }, { immediate: true })
  const url = computed(() => (draft.value ? `/api/attachments/${draft.value.attachmentId}/file` : null))
  // From the fetched row, not the draft: the same on the server and in the browser, so safe to render.
  const savedId = computed(() => data.value?.attachmentId ?? null)

  async function save() {
    if (!draft.value) return
    saving.value = true
    problem.value = ''
    try {
      const url: string = `/api/designs/${toValue(designId)}/reference`
      data.value = await $fetch<ReferenceRow>(url, { method: 'PUT', body: draft.value })
    }
    catch (err: unknown) {
      const e = errorInfo(err)
      problem.value = Object.values(e.fields)[0] ?? e.message
    }
    finally {
      saving.value = false
    }
  }

  /** Puts an attached image under the plate, at first about as wide as the plate, and starts calibrating. */
  async function place(file: AttachmentRow, plateWidth: number) {
    problem.value = ''
    try {
      const size = await naturalSize(file.url)
      draft.value = { attachmentId: file.id, x: 0, y: 0, rotation: 0, mmPerPixel: Math.max(plateWidth * 1.2, 100) / Math.max(size.width, 1), opacity: 0.5 }
      hidden.value = false
      await save()
      startCalibration()
    }
    catch (err: unknown) {
      problem.value = err instanceof Error ? err.message : 'The image could not be placed'
    }
  }

  function startCalibration() {
    points.value = []
    mode.value = 'calibrate'
  }

  function pick(p: Point) {
    if (mode.value !== 'calibrate') return
    points.value = points.value.length >= 2 ? [p] : [...points.value, p]
  }

  /**
   * Scales the image so the two picked points lie `realMm` apart, about their
   * midpoint (which stays where it is on the plate).
   */
  async function calibrate(realMm: number) {
    const [a, b] = points.value
    if (!draft.value || !a || !b) return
    const shown = Math.hypot(b.x - a.x, b.y - a.y)
    if (shown <= 0 || realMm <= 0) {
      problem.value = 'Pick two different points'
      return
    }
    const k = realMm / shown
    const m = { x: (a.x + b.x) / 2, y: (a.y + b.y) / 2 }
    draft.value = {
      ...draft.value,
      mmPerPixel: draft.value.mmPerPixel * k,
      x: m.x + (draft.value.x - m.x) * k,
      y: m.y + (draft.value.y - m.y) * k,
    }
    points.value = []
    mode.value = 'view'
    await save()
  }

  function cancel() {
    points.value = []
    mode.value = 'view'
  }

  async function remove() {
    saving.value = true
    problem.value = ''
    try {
      const url: string = `/api/designs/${toValue(designId)}/reference`
      await $fetch(url, { method: 'DELETE' })
      data.value = null
      mode.value = 'view'
    }
    catch (err: unknown) {
      problem.value = errorInfo(err).message
    }
    finally {
      saving.value = false
    }
  }

  return { draft, url, savedId, mode, points, saving, problem, hidden, save, place, startCalibration, pick, calibrate, cancel, remove, refresh }
}

export type ReferenceEditor = ReturnType<typeof useReferenceEditor>
