import { beforeEach, describe, expect, it } from 'vitest'
import { registerEndpoint } from '@nuxt/test-utils/runtime'
import { createError } from 'h3'
import { setActivePinia, createPinia } from 'pinia'
import { defaultParams } from '~~/geometry'
import { useEditorStore } from '~/stores/editor'

const DESIGN = '22222222-2222-4222-8222-222222222222'
const latest = { id: 'r5', number: 5, note: 'Moved the casters', createdAt: '2026-11-02T16:00:00.000Z', author: { id: 'u2', name: 'Morgan Reyes' } }
const sent: { basedOn: number }[] = []

registerEndpoint(`/api/designs/${DESIGN}/revisions`, {
  method: 'POST',
  handler: async (event) => {
    const body = await (await import('h3')).readBody<{ basedOn: number }>(event)
    sent.push(body)
    if (body.basedOn !== 5) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'stale', data: { latest } })
    return { id: 'r6', number: 6, note: 'mine', createdAt: '2026-11-02T17:00:00.000Z', author: { id: 'u1', name: 'Priya Okafor' } }
  },
})
registerEndpoint('/api/revisions/r5', () => ({ ...latest, designId: DESIGN, params: { ...defaultParams(), tubeDiameter: 500 } }))

beforeEach(() => {
  setActivePinia(createPinia())
  sent.length = 0
})

describe('editor store: a save that lost the race', () => {
  it('keeps our changes and says who saved meanwhile', async () => {
    const store = useEditorStore()
    store.load(DESIGN, { id: 'r4', number: 4, params: defaultParams() })
    store.update((d) => { d.casterCount = 5 })
    expect(await store.save('mine')).toBe(false)
    expect(store.conflict?.latest.author.name).toBe('Morgan Reyes')
    expect(store.conflict?.latest.number).toBe(5)
    expect(store.params.casterCount).toBe(5)
    expect(store.dirty).toBe(true)
  })

  it('can save ours on top of theirs', async () => {
    const store = useEditorStore()
    store.load(DESIGN, { id: 'r4', number: 4, params: defaultParams() })
    store.update((d) => { d.casterCount = 5 })
    await store.save('mine')
    expect(await store.saveOnTop()).toBe(true)
    expect(sent.map(s => s.basedOn)).toEqual([4, 5])
    expect(store.base?.number).toBe(6)
    expect(store.conflict).toBeNull()
  })

  it('can drop ours and load theirs', async () => {
    const store = useEditorStore()
    store.load(DESIGN, { id: 'r4', number: 4, params: defaultParams() })
    store.update((d) => { d.casterCount = 5 })
    await store.save('mine')
    await store.reloadLatest()
    expect(store.base).toEqual({ id: 'r5', number: 5 })
    expect(store.params.tubeDiameter).toBe(500)
    expect(store.params.casterCount).toBe(defaultParams().casterCount)
    expect(store.dirty).toBe(false)
  })
})
