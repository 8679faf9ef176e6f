// The build sheet as a carpenter reads it (issue 23, item 16), read back with
// poppler's pdftotext and checked against hand values: 1 in = 25.4 mm (NIST SP
// 811); a "3/4 in" panel is performance category 23/32, 0.688-0.750 in (PS 1-19,
// REFERENCES); a blank is the overall size plus 1/2 in all round (common shop
// practice, from memory). Page 1 is rendered with pdftoppm for a person to look at.
// The stability and load rows are another part of the sheet and not checked here.
import { execFileSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import { beforeAll, describe, expect, it } from 'vitest'
import { buildPlate, plateParamsSchema } from '../../../geometry/core'
import { renderBuildSheetPdf } from '../../../geometry/export'
import { loadTemplateFontNode } from '../../../geometry/export/fonts-node'

const IN = 25.4
const shots = 'test-results/unit'
let font: Uint8Array
beforeAll(async () => {
  font = await loadTemplateFontNode()
  mkdirSync(shots, { recursive: true })
})

const meta = { designName: 'Sheet check', revision: 3, date: '2026-12-05', author: 'Test' }

async function sheetText(params: Record<string, unknown>, units: 'in' | 'mm', name: string): Promise<string> {
  const plate = buildPlate(plateParamsSchema.parse(params))
  const file = `${shots}/${name}.pdf`
  writeFileSync(file, await renderBuildSheetPdf(plate, { units, meta, font }))
  return execFileSync('/usr/bin/pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ')
}

/** Inches to the nearest 1/16 as a tape reads them, written here apart from the library's formatter. */
function sixteenths(mm: number): string {
  const n = Math.round((mm / IN) * 16)
  const whole = Math.floor(n / 16)
  let num = n % 16
  let den = 16
  while (num > 0 && num % 2 === 0) { num /= 2; den /= 2 }
  return num === 0 ? `${whole} in` : whole === 0 ? `${num}/${den} in` : `${whole}-${num}/${den} in`
}

describe('plywood as the shop buys it, one total thickness', () => {
  it('the default: 23/32 in plywood sold as 3/4 in; 2 layers are 46/32 = 1-7/16 in everywhere the total shows', async () => {
    const text = await sheetText({}, 'in', 'build-sheet-default-in')
    // PS 1-19: category 23/32 is the retail "3/4 in" panel.
    expect(text).toContain('23/32 in plywood (sold as 3/4 in)')
    // Never rounded to a tape's 1/16 (23/32 would read 3/4, a panel it is not).
    expect(text).not.toMatch(/3\/4 in plywood|11\/16 in plywood/)
    // Hand sum: 2 x 23/32 = 46/32 = 1-7/16 in. Every total on the sheet is this one figure.
    const totals = [...text.matchAll(/(\d[\d/-]* in) thick in all/g)].map((m) => m[1])
    expect(totals.length).toBeGreaterThanOrEqual(2)
    for (const t of totals) expect(t).toBe('1-7/16 in')
    expect(text).toContain('Thickness, floor gap 1-7/16 in (2 × 23/32 in)')
  })

  it('in millimetres: 18.5 mm plywood (23/32 in = 18.256 mm, to the half millimetre), sold as 3/4 in', async () => {
    const text = await sheetText({}, 'mm', 'build-sheet-default-mm')
    expect(text).toContain('18.5 mm plywood (sold as 3/4 in, category 23/32 in)')
    // 36.5125 mm to the millimetre.
    expect(text).toContain('37 mm thick in all')
  })

  it('a 5/8 in panel (19/32 in, PS 1-19 category 19/32, from memory) and an odd measured sheet are named as measured', async () => {
    expect(await sheetText({ sheetThickness: (19 / 32) * IN, rabbetDepth: 0.25 * IN }, 'in', 'build-sheet-58')).toContain('19/32 in plywood (sold as 5/8 in)')
    // 1 in of birch: no retail category here, the measure alone.
    const thick = await sheetText({ sheetThickness: IN, layers: 1 }, 'in', 'build-sheet-1in')
    expect(thick).toContain('1 in plywood')
    expect(thick).not.toContain('sold as')
  })
})

describe('fractions to 1/32 in below an inch', () => {
  it('an 11/32 in rabbet (8.731 mm) and a 7/32 in fastener hole (5.556 mm) read exactly, not as 3/8 or 1/4', async () => {
    const text = await sheetText({ rabbetDepth: (11 / 32) * IN, fasteners: { diameter: (7 / 32) * IN } }, 'in', 'build-sheet-32nds')
    expect(text).toContain('11/32 in deep')
    expect(text).toContain('pan screws (7/32 in)')
    // Default floor gap by hand: 66.675 - (36.5125 - 9.525 + 31.75) = 7.9375 mm = 10/32 = 5/16 in; with this
    // rabbet 1/32 in shallower the seat rises 1/32 in: 9/32 in.
    expect(text).toContain('Thickness, floor gap 1-7/16 in (2 × 23/32 in), 9/32 in')
  })
})

describe('the blank', () => {
  it('is the outline\'s bounding box plus 1/2 in all round (box read off the outline here)', async () => {
    const plate = buildPlate(plateParamsSchema.parse({}))
    const xs = plate.outline.map((p) => p[0])
    const ys = plate.outline.map((p) => p[1])
    const w = Math.max(...xs) - Math.min(...xs) + IN
    const h = Math.max(...ys) - Math.min(...ys) + IN
    const text = await sheetText({}, 'in', 'build-sheet-blank')
    expect(text).toContain(`Layer 1 (top) 23/32 in plywood (sold as 3/4 in) ${sixteenths(w)} × ${sixteenths(h)}`)
    expect(text).toContain(`Cut 2 blanks of ${sixteenths(w)} × ${sixteenths(h)} from 23/32 in plywood`)
  })
})

describe('steps a carpenter can follow', () => {
  const stepOf = (text: string, words: RegExp): number => {
    const m = text.match(new RegExp(`(\\d+)\\. ${words.source}`))
    expect(m, `a step "${words.source}"`).not.toBeNull()
    return Number(m![1])
  }

  it('registration holes through the template before the layers part, glue, outline, pockets, then the rabbets that follow them, pans, casters', async () => {
    const text = await sheetText({}, 'in', 'build-sheet-steps')
    const blanks = stepOf(text, /Cut 2 blanks/)
    const register = stepOf(text, /Stack the blanks/)
    const glue = stepOf(text, /Laminate/)
    const outline = stepOf(text, /Mark the outline/)
    const pockets = stepOf(text, /Cut the pockets/)
    const rabbets = stepOf(text, /Route each rabbet/)
    const pans = stepOf(text, /Fit the pans/)
    const casters = stepOf(text, /Bolt each caster/)
    // Common shop practice: a bearing-guided rabbeting bit needs the pocket's wall to ride on, and the layers are
    // registered by holes drilled through them together.
    expect([blanks, register, glue, outline, pockets, rabbets, pans, casters]).toEqual([...[blanks, register, glue, outline, pockets, rabbets, pans, casters]].sort((a, b) => a - b))
    expect(new Set([blanks, register, glue, outline, pockets, rabbets, pans, casters]).size).toBe(8)
    expect(text).toMatch(/through the template and every layer, before the layers part/)
    expect(text).toMatch(/bearing rides the pocket's wall/)
  })

  it('a pan that sits on the plate: rim down in the rabbet, body standing above the top face (default 1-1/4 - 3/8 = 7/8 in)', async () => {
    const text = await sheetText({}, 'in', 'build-sheet-pans')
    expect(text).not.toMatch(/drop each through its pocket/i)
    expect(text).toContain('set each pan crown up on the plate, its rim down in the rabbet and its body standing 7/8 in above the top face')
    // A flat plate in the rabbet (pan depth 0) does not stand up at all.
    const flat = await sheetText({ panDepth: 0 }, 'in', 'build-sheet-flat-pan')
    expect(flat).toContain('set each flat pan in its rabbet, flush with the top face')
  })

  it('a long sheet runs on to another page rather than losing its cautions off the foot', async () => {
    // Four casters, a 5000 kg load at 36 in, two blocks through 2 in openings: many findings on page 2.
    const IN_ = 25.4
    const text = await sheetText({
      tubeDiameter: 700, casterCount: 4, casterOffset: 12 * IN_, pocketDiameter: 100,
      caster: { swivelLead: 1.5 * IN_ }, lobes: { irregularity: 0 },
      unit: { load: { weight: 5000, height: 36 * IN_ }, hardwarePerCaster: 0, casterRating: 500, counterweight: { count: 2 } },
    }, 'in', 'build-sheet-long')
    expect(text).toContain('Cautions')
    expect(text).toContain('IEC 62368-1')
    expect(text).toMatch(/Steel counterweight is heavy/)
    // Every line of the last caution is there, to its last words.
    expect(text).toMatch(/take the blocks out before the unit is tipped, carried or stored/)
  })

  it('renders page 1 and 2 to PNG with pdftoppm (look at test-results/unit/build-sheet-default-in-*.png)', () => {
    execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '70', `${shots}/build-sheet-default-in.pdf`, `${shots}/build-sheet-default-in`])
  })
})
