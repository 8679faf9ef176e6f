import { beforeEach, describe, expect, it } from 'vitest'
import { registerEndpoint } from '@nuxt/test-utils/runtime'
import { createError } from 'h3'
import { setActivePinia, createPinia } from 'pinia'
import { defaultParams } from '~~/geometry'
import { useEditorStore } from '~/stores/editor'

// The server's answer while its database is away (server/plugins/database.ts): 503 with a code.
const DESIGN = '33333333-3333-4333-8333-333333333333'
let away = true
registerEndpoint(`/api/designs/${DESIGN}/revisions`, {
  method: 'POST',
  handler: () => {
    if (away) throw createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: 'Rootplate cannot reach its database right now.', data: { code: 'database-unavailable' } })
    return { id: 'r2', number: 2, note: 'kept', createdAt: '2026-11-02T17:00:00.000Z', author: { id: 'u1', name: 'Priya Okafor' } }
  },
})

beforeEach(() => {
  setActivePinia(createPinia())
  away = true
})

describe('editor store: a save while the database is away', () => {
  it('keeps the unsaved params, says so, and saves them once the server answers again', async () => {
    const store = useEditorStore()
    store.load(DESIGN, { id: 'r1', number: 1, params: defaultParams() })
    store.update((d) => { d.casterCount = 5 })
    expect(await store.save('kept')).toBe(false)
    expect(store.saveError).toContain('Rootplate cannot reach its database; your unsaved changes are kept in this tab.')
    expect(store.params.casterCount).toBe(5)
    expect(store.dirty).toBe(true)
    expect(store.canUndo).toBe(true)
    expect(store.base?.number).toBe(1)

    away = false
    expect(await store.save('kept')).toBe(true)
    expect(store.base?.number).toBe(2)
    expect(store.dirty).toBe(false)
    expect(store.saveError).toBeNull()
  })
})
