// The plan page's fetch (composables/useSheetPlan.ts) when the server answers
// 429: the member's earlier plans, abandoned as the counts were typed, are
// still being nested (two at a time per member, server/services/export-runner.ts);
// the page asks again shortly and shows the plan, not the refusal.
import { describe, expect, it, vi } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { createError } from 'h3'
import { defineComponent, h, ref } from 'vue'
import { useSheetPlan } from '~/composables/useSheetPlan'
import type { SheetPlanRequest } from '~~/shared/utils/sheet-plans'

let refusals = 2
let asked = 0
registerEndpoint('/api/sheet-plans', {
  method: 'POST',
  handler: () => {
    asked++
    if (refusals-- > 0) throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: 'You already have 2 files being made', data: { retryAfter: 5 } })
    return { figures: { plates: 3 } }
  },
})

const request = ref<SheetPlanRequest | null>({
  items: [{ designId: '44444444-4444-4444-8444-444444444444', count: 3 }],
  sheet: { width: 1219.2, height: 2438.4, thickness: 18, margin: 12.7, kerf: 6.35 },
  workflow: 'panels',
  grain: false,
})

describe('useSheetPlan while the member\'s earlier plans are still being made', () => {
  it('asks again after a 429 and shows the plan once the server takes it', async () => {
    const Probe = defineComponent({
      setup() {
        const { plan, error } = useSheetPlan(request)
        return () => h('p', plan.value ? `plates ${(plan.value as unknown as { figures: { plates: number } }).figures.plates}` : (error.value ?? 'waiting'))
      },
    })
    const wrapper = await mountSuspended(Probe)
    await vi.waitFor(() => expect(wrapper.text()).toBe('plates 3'), { timeout: 8000, interval: 100 })
    expect(asked).toBe(3)
  }, 15_000)
})
