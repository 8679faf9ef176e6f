import type { SheetPlanRequest } from '~~/shared/utils/sheet-plans'
import { fileNameFrom, saveBlob } from '~/utils/save-file'
import type { SheetPlanView } from '~~/server/services/sheet-plan-jobs'

export type { SheetPlanView }

const BUSY_RETRY_MS = 1000
const BUSY_TRIES = 60

/**
 * The sheet plan for a request that changes as the person types: asked for
 * again a moment after the last change, the request before it abandoned, with
 * the busy flag, the server's message and field messages.
 */
export function useSheetPlan(request: Ref<SheetPlanRequest | null>) {
  const plan = ref<SheetPlanView | null>(null)
  const busy = ref(false)
  const error = ref<string | null>(null)
  const fields = ref<Record<string, string>>({})
  let controller: AbortController | null = null
  let timer: ReturnType<typeof setTimeout> | undefined

  async function run(body: SheetPlanRequest, tries = 0) {
    controller?.abort()
    const mine = new AbortController()
    controller = mine
    busy.value = true
    try {
      plan.value = await $fetch<SheetPlanView>('/api/sheet-plans', { method: 'POST', body, signal: mine.signal })
      error.value = null
      fields.value = {}
    }
    catch (err: unknown) {
      if (mine.signal.aborted) return
      const info = errorInfo(err)
      // 429: plans this page asked for and then abandoned as the person typed are still
      // being nested on the server (each member has two at a time); ask again shortly.
      if (info.status === 429 && tries < BUSY_TRIES) {
        await new Promise(resolve => setTimeout(resolve, BUSY_RETRY_MS))
        if (controller === mine && !mine.signal.aborted) return run(body, tries + 1)
        return
      }
      error.value = info.message
      fields.value = info.fields
    }
    finally {
      if (controller === mine) busy.value = false
    }
  }

  function follow(body: SheetPlanRequest | null) {
    clearTimeout(timer)
    if (!body) {
      controller?.abort()
      busy.value = false
      plan.value = null
      error.value = null
      fields.value = {}
      return
    }
    busy.value = true
    timer = setTimeout(() => run(body), 400)
  }
  // Only in the browser, once mounted: the server renders the page without a plan, and the
  // first paint matches it.
  onMounted(() => {
    watch(request, follow, { deep: true, immediate: true })
  })
  onBeforeUnmount(() => {
    clearTimeout(timer)
    controller?.abort()
  })

  return { plan, busy, error, fields }
}

/** POST a request for a file and hand the bytes to the browser under the server's name. */
export async function downloadPlanFile(url: string, body: unknown, fallbackName: string): Promise<void> {
  const res = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) })
  if (!res.ok) {
    let message = `The server answered ${res.status}`
    try {
      const b = await res.json() as { message?: string }
      if (b.message) message = b.message
    }
    catch (err: unknown) {
      if (!(err instanceof SyntaxError)) throw err
    }
    throw new Error(message)
  }
  saveBlob(await res.blob(), fileNameFrom(res.headers.get('content-disposition')) ?? fallbackName)
}
