import { beforeEach, describe, expect, it } from 'vitest'
import { registerEndpoint } from '@nuxt/test-utils/runtime'
import { setActivePinia, createPinia } from 'pinia'
import { defaultParams } from '~~/geometry'
import { useEditorStore } from '~/stores/editor'
import { moveLobeTip, movePocket } from '~/utils/plate-handles'

const DESIGN = '11111111-1111-4111-8111-111111111111'

function loaded() {
  const store = useEditorStore()
  store.load(DESIGN, { id: 'r3', number: 3, params: defaultParams() })
  return store
}

beforeEach(() => setActivePinia(createPinia()))

describe('editor store: undo and redo', () => {
  it('undoes and redoes parameter changes in order', () => {
    const store = loaded()
    const start = store.params.tubeDiameter
    store.update((d) => { d.tubeDiameter = 400 })
    store.update((d) => { d.casterCount = 4 })
    expect(store.dirty).toBe(true)
    store.undo()
    expect(store.params.casterCount).toBe(3)
    expect(store.params.tubeDiameter).toBe(400)
    store.undo()
    expect(store.params.tubeDiameter).toBe(start)
    expect(store.dirty).toBe(false)
    expect(store.canUndo).toBe(false)
    store.redo()
    store.redo()
    expect(store.params.tubeDiameter).toBe(400)
    expect(store.params.casterCount).toBe(4)
    expect(store.canRedo).toBe(false)
  })

  it('a new change after an undo drops the redo steps', () => {
    const store = loaded()
    store.update((d) => { d.tubeDiameter = 400 })
    store.undo()
    store.update((d) => { d.tubeWall = 10 })
    expect(store.canRedo).toBe(false)
  })

  it('counts a whole drag as one step, and a change that changes nothing as none', () => {
    const store = loaded()
    const before = store.params.casterOffset
    store.beginDrag()
    for (let i = 1; i <= 30; i++) store.dragTo((d) => { movePocket(d, 0, { x: 0, y: before + i }) })
    store.endDrag()
    expect(store.params.casterOffset).toBe(before + 30)
    store.update((d) => { d.casterOffset = d.casterOffset })
    store.undo()
    expect(store.params.casterOffset).toBe(before)
    expect(store.canUndo).toBe(false)
  })

  it('a lobe drag writes a per-lobe override that brings the tip to the pointer', () => {
    const store = loaded()
    const tip = store.plate.lobeTips[1]!
    const target = { x: tip.x * 1.3, y: tip.y * 1.3 }
    store.beginDrag()
    // During a drag the canvas, and the handle maths, follow the light preview; the whole plate waits for the end.
    for (let i = 0; i < 6; i++) store.dragTo((d) => { moveLobeTip(d, store.livePlate, 1, target) })
    expect(store.plate.lobeTips[1]).toEqual(tip)
    store.endDrag()
    const moved = store.plate.lobeTips.find(t => t.index === 1)!
    expect(store.params.lobes.overrides.some(o => o.index === 1)).toBe(true)
    expect(Math.hypot(moved.x - target.x, moved.y - target.y)).toBeLessThan(2)
  })
})

describe('editor store: saving', () => {
  it('on 201 takes the new revision as its base and is clean again', async () => {
    registerEndpoint(`/api/designs/${DESIGN}/revisions`, { method: 'POST', handler: () => ({ id: 'r4', number: 4, note: 'x', createdAt: '2026-11-02T15:00:00Z', author: { id: 'u', name: 'Ana' } }) })
    const store = loaded()
    store.update((d) => { d.tubeDiameter = 400 })
    expect(await store.save('Wider tube')).toBe(true)
    expect(store.base).toEqual({ id: 'r4', number: 4 })
    expect(store.dirty).toBe(false)
  })
})
