import { describe, expect, it } from 'vitest'
import { exportFileName } from '../../../geometry/export/filename'

describe('exportFileName', () => {
  it('names a file after the design, size and revision', () => {
    expect(exportFileName({ designName: 'Oak trunk', sizeLabel: '18 in', revision: 3 }, 'dxf')).toBe('oak-trunk-18in-r3.dxf')
    expect(exportFileName({ designName: 'Birch', revision: 12 }, '.PDF')).toBe('birch-r12.pdf')
  })

  it('keeps only ASCII letters, digits and hyphens', () => {
    expect(exportFileName({ designName: 'Érable / "Große" Wurzel', sizeLabel: 'Large', revision: 1 }, 'svg')).toBe(
      'erable-grosse-wurzel-large-r1.svg',
    )
    expect(exportFileName({ designName: '***', revision: 2 }, 'dxf')).toBe('plate-r2.dxf')
  })
})
