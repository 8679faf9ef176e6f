import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { formatLength, parseLength } from '~~/geometry'
import ParamField from '~/components/plate/ParamField.vue'

const field = { path: 'tubeDiameter', label: 'Tube diameter', kind: 'length' as const }
function mount(units: 'in' | 'mm', value: number) {
  return mountSuspended(ParamField, {
    props: {
      field, value, defaultValue: 317.5, readOnly: false, units,
      formatLength: (mm: number) => formatLength(mm, units),
      parse: (t: string) => parseLength(t, { defaultUnit: units }),
    },
  })
}

// 1 in = 25.4 mm exactly (NIST SP 811); 17-1/2 in = 444.5 mm.
describe('a length field', () => {
  it('shows millimetres as inches with fractions, or as millimetres', async () => {
    expect((await mount('in', 403.225)).find('input').element.value).toBe('15-7/8"')
    expect((await mount('mm', 403.225)).find('input').element.value).toBe('403 mm')
  })

  it('accepts trade notation and emits millimetres', async () => {
    const w = await mount('in', 317.5)
    await w.find('input').setValue('17-1/2"')
    await w.find('input').trigger('keydown', { key: 'Enter' })
    expect(w.emitted('change')?.[0]).toEqual([444.5])
    await w.find('input').setValue('400 mm')
    await w.find('input').trigger('blur')
    expect(w.emitted('change')?.[1]).toEqual([400])
  })

  it('keeps garbage out and says why', async () => {
    const w = await mount('in', 317.5)
    await w.find('input').setValue('about a foot')
    await w.find('input').trigger('blur')
    expect(w.emitted('change')).toBeUndefined()
    expect(w.find('[role], .field-error').text()).toMatch(/length/i)
  })

  it('offers a reset to the default only when the value differs', async () => {
    expect((await mount('in', 317.5)).text()).not.toContain('reset')
    const w = await mount('in', 400)
    const reset = w.findAll('button').find(b => b.text() === 'reset')!
    await reset.trigger('click')
    expect(w.emitted('change')?.[0]).toEqual([317.5])
  })
})
