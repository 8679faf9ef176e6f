import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { defaultParams, formatLength, parseLength, type PlateParams } from '~~/geometry'
import ParamPanel from '~/components/plate/ParamPanel.vue'

function mount(params: PlateParams, units: 'in' | 'mm' = 'in') {
  return mountSuspended(ParamPanel, {
    props: {
      params, issues: [], readOnly: false, units,
      formatLength: (mm: number) => formatLength(mm, units),
      parse: (t: string) => parseLength(t, { defaultUnit: units }),
    },
  })
}
const withKind = (kind: PlateParams['fasteners']['kind']) => {
  const p = defaultParams()
  p.fasteners.kind = kind
  return p
}
const labels = (w: Awaited<ReturnType<typeof mount>>) => w.findAll('label').map(l => l.text())

describe('the pan fastener fields', () => {
  it('offers the fastener kind as a choice and emits the picked kind', async () => {
    const w = await mount(defaultParams())
    const select = w.find('select#param-fasteners-kind')
    expect(select.exists()).toBe(true)
    const option = select.findAll('option').find(o => o.text() === 'through-bolts with T-nuts')!
    expect(option).toBeDefined()
    await select.setValue(option.element.value)
    expect(w.emitted('change')?.[0]).toEqual(['fasteners.kind', 'bolt-tnut'])
  })

  it('shows the T-nut flange only for T-nuts, the counterbore only for a counterbore', async () => {
    const screw = labels(await mount(withKind('screw')))
    expect(screw).not.toContain('T-nut flange')
    expect(screw).not.toContain('Counterbore diameter')
    const tnut = labels(await mount(withKind('bolt-tnut')))
    expect(tnut).toContain('T-nut flange')
    expect(tnut).not.toContain('Counterbore depth')
    const bore = labels(await mount(withKind('bolt-counterbore')))
    expect(bore).toContain('Counterbore diameter')
    expect(bore).toContain('Counterbore depth')
    expect(bore).not.toContain('T-nut flange')
  })

  // 1 in = 25.4 mm exactly (NIST SP 811): 1/16 in = 1.5875 mm, 3/4 in = 19.05 mm, 3/8 in = 9.525 mm.
  it('shows fastener lengths in inches with fractions and reads them back as millimetres', async () => {
    const p = withKind('bolt-tnut')
    p.fasteners.tnutFlange = 1.5875
    p.fasteners.length = 19.05
    const w = await mount(p)
    expect((w.find('#param-fasteners-tnutFlange').element as HTMLInputElement).value).toBe('1/16"')
    expect((w.find('#param-fasteners-length').element as HTMLInputElement).value).toBe('3/4"')
    const bore = w.find('#param-fasteners-edgeWood')
    await bore.setValue('3/8"')
    await bore.trigger('keydown', { key: 'Enter' })
    expect(w.emitted('change')?.[0]).toEqual(['fasteners.edgeWood', 9.525])
  })

  // 1/16 in = 1.5875 mm (NIST SP 811); the panel shows it as a fraction.
  it('has a field for the pan tuck', async () => {
    const p = defaultParams()
    p.panTuck = 1.5875
    const w = await mount(p)
    expect((w.find('#param-panTuck').element as HTMLInputElement).value).toBe('1/16"')
  })
})
