import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { analyseUnit, buildPlate, formatLength, plateParamsSchema } from '~~/geometry/core'
import StabilityFigures from '~/components/stability/StabilityFigures.vue'

const IN = 25.4 // 1 in = 25.4 mm exactly (NIST SP 811)

function mount(block: { length: number; width: number; thickness: number }, units: 'in' | 'mm') {
  const plate = buildPlate(plateParamsSchema.parse({ unit: { counterweight: { count: 2, block } } }))
  return mountSuspended(StabilityFigures, {
    props: { analysis: analyseUnit(plate), units, formatLength: (mm: number) => formatLength(mm, units) },
  })
}

describe('the counterweight block figure', () => {
  // By hand: the default tube is 12-1/2 in outside with a 1/4 in wall, 12 in inside. A 14 x 14 in block
  // has a 14 in side, longer than the 12 in inside diameter: it cannot lie flat inside the tube at all.
  it('says plainly that no block fits, with the block size in inches with fractions', async () => {
    const w = await mount({ length: 14 * IN, width: 14 * IN, thickness: 1.5 * IN }, 'in')
    const note = w.find('[data-testid="stability-block-note"]').text()
    expect(note).toContain('no block fits inside the tube')
    expect(note).toContain('14" x 14" x 1-1/2"')
    expect(note).not.toMatch(/\b0 fit a layer/)
  })

  it('gives the block size in millimetres in metric', async () => {
    const w = await mount({ length: 14 * IN, width: 14 * IN, thickness: 1.5 * IN }, 'mm')
    // 14 in = 355.6 mm, 1-1/2 in = 38.1 mm; metric lengths show to the nearest 1/2 mm.
    expect(w.find('[data-testid="stability-block-note"]').text()).toContain('355.5 mm x 355.5 mm x 38 mm')
  })

  // By hand: a 1 x 1 x 1 in block lies many times over in a 12 in circle less the pans: some fit.
  it('counts the blocks a layer takes when they fit', async () => {
    const w = await mount({ length: IN, width: IN, thickness: IN }, 'in')
    const note = w.find('[data-testid="stability-block-note"]').text()
    expect(note).toMatch(/\b[1-9]\d* fit a layer/)
    expect(note).not.toContain('no block fits')
  })
})
