// The editor's canvas and roots as a technical director uses them, in Chromium:
// roots typed one by one and kept in place when the lobe count changes, a
// root left without a lobe named at the count with a remedy for it alone,
// live figures while dragging, compare drawn over the plate, "reset" to the
// saved revision, "Restore as new" asking first, Ctrl+Z in a field, the skip
// link and the nudge announcement, the phone and tablet layout. Each test
// makes its own design through the API; screenshots go to test-results/e2e.
import { mkdirSync, readFileSync } from 'node:fs'
import { PNG } from 'pngjs'
import { afterAll, afterEach, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { launchChromium, takePageProblems, watchPage } from './support/browser'
import { api, signIn } from './support/api'

const shots = 'test-results/e2e'
let browser: Browser
let designer = ''

// Four even lobes on a 16 in tube (406.4 mm; 1 in = 25.4 mm, NIST SP 811), no irregularity,
// rotation 0: lobe k at k * 90 degrees, each tip tube/2 + valley + reach = 203.2 + 30 + 120 =
// 353.2 mm out (the construction at the top of geometry/outline/shape.ts).
const params = { tubeDiameter: 406.4, casterCount: 4, casterOffset: 230, rotation: 0, lobes: { count: 4, reach: 120, width: 160, roundness: 0.5, irregularity: 0, phase: 0, valley: 30 } }

beforeAll(async () => {
  mkdirSync(shots, { recursive: true })
  browser = await launchChromium()
  designer = await signIn('designer@rootplate.test')
})
afterAll(() => browser?.close())
afterEach(() => { expect(takePageProblems()).toEqual([]) })

async function newDesign(name: string, p: object = params): Promise<string> {
  const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: `${name} ${Date.now()}`, params: p } })
  expect(created.status).toBe(201)
  return created.body.id
}

/** Opens a design with the designer's session cookie (one API sign-in for the file, so no test meets the sign-in limit). */
async function open(id: string, viewport = { width: 1440, height: 900 }): Promise<Page> {
  const base = inject('baseUrl')
  const context = await browser.newContext({ viewport })
  await context.addCookies(designer.split('; ').map((c) => {
    const at = c.indexOf('=')
    return { name: c.slice(0, at), value: c.slice(at + 1), url: base }
  }))
  const page = watchPage(await context.newPage())
  await page.goto(`${base}/designs/${id}`)
  await page.getByTestId('plate-canvas').waitFor()
  await page.getByText('Preparing the drawing…').waitFor({ state: 'detached' })
  return page
}

/** Shop notation as the page shows it (`27-7/8"`) to millimetres. */
function inches(shown: string | null): number {
  const m = /^(\d+)(?:-(\d+)\/(\d+))?"$/.exec(shown?.trim() ?? '')
  if (!m) throw new Error(`not a length in inches: ${shown}`)
  return (Number(m[1]) + (m[2] ? Number(m[2]) / Number(m[3]) : 0)) * 25.4
}
const width = async (page: Page) => inches(await page.getByTestId('metric-width').textContent())
/** Shown to 1/16 in (1.6 mm) at most off, half of that by rounding. */
const SHOWN = 25.4 / 16

async function typeRoot(page: Page, root: number, field: 'reach' | 'width' | 'fromAxis', value: string) {
  await page.getByTestId('root-select').selectOption(String(root - 1))
  const input = page.getByTestId(`root-${field}`)
  await input.fill(value)
  await input.press('Enter')
}

describe('roots one by one', () => {
  it('a typed reach, a lower count that keeps the root, and a root without a lobe named at the count with its own remedy', async () => {
    const id = await newDesign('Roots typed')
    const page = await open(id)
    // Root 3 (at 180 degrees) typed to 10 in: its tip 203.2 + 30 + 254 = 487.2 mm out, so the
    // plate is 487.2 + 353.2 = 840.4 mm wide.
    await typeRoot(page, 3, 'reach', '10"')
    await expect.poll(async () => Math.abs(await width(page) - 840.4)).toBeLessThan(SHOWN)
    // Three lobes: the even places are 0, 120 and 240 degrees, but the pulled root stays at 180
    // and the first lobe at 0, so the width holds.
    const count = page.getByRole('textbox', { name: 'Lobes', exact: true })
    await count.fill('3')
    await count.press('Enter')
    await expect.poll(() => count.inputValue()).toBe('3')
    expect(Math.abs(await width(page) - 840.4)).toBeLessThan(SHOWN)

    // Root 1 (0 degrees) to 8 in: 203.2 + 30 + 203.2 = 436.4 mm; width 436.4 + 487.2 = 923.6 mm.
    await typeRoot(page, 1, 'reach', '8"')
    await expect.poll(async () => Math.abs(await width(page) - 923.6)).toBeLessThan(SHOWN)
    // One lobe cannot carry two pulled roots: the one left over is named at the count field.
    await count.fill('1')
    await count.press('Enter')
    await expect.poll(() => count.getAttribute('aria-invalid')).toBe('true')
    const message = await page.locator('#param-lobes-count-msg').textContent()
    expect(message).toMatch(/root 2/i)
    expect(await page.getByTestId('stranded-root').count()).toBe(1)
    expect(await page.getByTestId('save').isDisabled()).toBe(true)
    await page.screenshot({ path: `${shots}/roots-stranded.png` })
    // Dropping that root's shape alone clears it; root 1 keeps its 8 in reach.
    await page.getByRole('button', { name: /Drop root 2/ }).click()
    await expect.poll(() => count.getAttribute('aria-invalid')).toBe('false')
    expect(await page.getByRole('list', { name: 'Roots shaped by hand' }).textContent()).toMatch(/Root 1: 8"/)
    expect(await page.getByTestId('save').isDisabled()).toBe(false)
    await page.context().close()
  })

  it('dragging a root shows its reach, width and angle as it moves, in inches', async () => {
    const id = await newDesign('Roots dragged')
    const page = await open(id)
    const tip = page.locator('[data-handle="lobe-1"]')
    const box = (await tip.boundingBox())!
    const from = { x: box.x + box.width / 2, y: box.y + box.height / 2 }
    await page.mouse.move(from.x, from.y)
    await page.mouse.down()
    const seen: string[] = []
    // Lobe 2 points straight up the screen (90 degrees): pull it further up.
    for (let i = 1; i <= 6; i++) {
      await page.mouse.move(from.x, from.y - 12 * i)
      seen.push(await page.getByTestId('handle-readout').textContent() ?? '')
    }
    await page.screenshot({ path: `${shots}/roots-drag.png` })
    // Each figure stays on one line, however the readout wraps: a length such as 25-5/16" is never split at its hyphen.
    const lines = await page.getByTestId('handle-readout').locator('[data-readout-part]').evaluateAll(els => els.map(el => el.getClientRects().length))
    expect(lines.length).toBe(4)
    expect(lines.every(n => n === 1)).toBe(true)
    await page.mouse.up()
    expect(seen.at(-1)).toMatch(/^Root 2: reach \d+(-\d+\/\d+)?", width \d+(-\d+\/\d+)?", [\d.]+° from the axis/)
    // The reach grows while the pointer moves: 120 mm (4-3/4 in) at the start.
    const reaches = seen.map(s => inches(/reach ([^,]+),/.exec(s)![1]!))
    expect(reaches.at(-1)!).toBeGreaterThan(reaches[0]! + 10)
    expect(reaches[0]!).toBeGreaterThan(120)
    await page.context().close()
  })
})

describe('compare', () => {
  it('draws the older revision over the newer plate, so a change inside the outline shows', async () => {
    // Only the pockets move (caster offset 230 -> 190 mm): the outline is the same, the difference is inside it.
    const id = await newDesign('Compare inside')
    const saved = await api(`/api/designs/${id}/revisions`, { method: 'POST', cookie: designer, body: { params: { ...params, casterOffset: 190 }, note: 'Pockets in', basedOn: 1 } })
    expect(saved.status).toBe(201)
    const page = await open(id)
    const items = page.getByTestId('revisions').locator('li')
    await items.nth(0).getByRole('checkbox').check()
    await items.nth(1).getByRole('checkbox').check()
    await page.getByTestId('compare').click()
    await page.getByTestId('compare-table').waitFor()
    await page.waitForTimeout(100)
    const shot = `${shots}/compare-inside-1440.png`
    await page.getByTestId('plate-canvas').screenshot({ path: shot })
    const png = PNG.sync.read(readFileSync(shot))
    // The compare colour #3f6fb0 (utils/plate-drawing.ts) within the middle of the view, where
    // the newer plate's fill lies (the plate spans 706 mm, the view fits it with a margin).
    let older = 0
    const cx = png.width / 2
    const cy = png.height / 2
    const r = Math.min(png.width, png.height) * 0.3
    for (let y = 0; y < png.height; y++) {
      for (let x = 0; x < png.width; x++) {
        if (Math.hypot(x - cx, y - cy) > r) continue
        const i = (y * png.width + x) * 4
        if (Math.abs(png.data[i]! - 0x3f) + Math.abs(png.data[i + 1]! - 0x6f) + Math.abs(png.data[i + 2]! - 0xb0) < 60) older++
      }
    }
    expect(older).toBeGreaterThan(200)
    await page.context().close()
  })
})

describe('reset, restore and undo', () => {
  it('"reset" goes back to the saved revision, Restore as new asks first, Ctrl+Z in a field undoes without a new edit', async () => {
    const id = await newDesign('Reset to saved', { ...params, casterOffset: 231 })
    // The last saved revision has a 20-3/8 in tube (517.525 mm); the factory value is 12-1/2 in.
    const second = await api(`/api/designs/${id}/revisions`, { method: 'POST', cookie: designer, body: { params: { ...params, tubeDiameter: 517.525 }, note: 'Bigger tube', basedOn: 1 } })
    expect(second.status).toBe(201)
    const page = await open(id)
    const tube = page.getByRole('textbox', { name: 'Tube diameter', exact: true })
    expect(await tube.inputValue()).toBe('20-3/8"')
    await tube.fill('22"')
    await tube.press('Enter')
    await expect.poll(() => tube.inputValue()).toBe('22"')
    await page.getByRole('button', { name: 'Reset Tube diameter to its default' }).click()
    await expect.poll(() => tube.inputValue()).toBe('20-3/8"')

    // Ctrl+Z in the field after its value was entered undoes the design (back to 22 in)
    // and leaves a redo, not a new edit.
    await tube.focus()
    await page.keyboard.press('Control+z')
    await expect.poll(() => tube.inputValue()).toBe('22"')
    await tube.blur()
    expect(await page.getByRole('button', { name: 'Redo' }).isDisabled()).toBe(false)

    // With that unsaved edit, Restore as new asks first, and "no" keeps it.
    let asked = ''
    page.once('dialog', (d) => { asked = d.message(); void d.dismiss() })
    await page.getByTestId('revisions').getByRole('button', { name: 'Restore as new' }).first().click()
    await expect.poll(() => asked).toMatch(/unsaved changes/)
    expect(await tube.inputValue()).toBe('22"')
    expect(await page.getByTestId('revisions').locator('li').count()).toBe(2)
    await page.context().close()
  })
})

describe('keyboard', () => {
  it('a skip link reaches the drawing, and a nudge says the new figures', async () => {
    const id = await newDesign('Keyboard')
    const page = await open(id)
    await page.getByTestId('skip-to-drawing').focus()
    await page.keyboard.press('Enter')
    expect(await page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).toBe('plate-canvas')
    // The first handle is the next tab stop after the drawing.
    await page.keyboard.press('Tab')
    expect(await page.evaluate(() => document.activeElement?.getAttribute('data-handle'))).toBe('lobe-0')
    // Lobe 1 points along +x: one press of the right arrow moves it 1/16 in further out.
    const before = await page.getByTestId('handle-readout').textContent()
    await page.keyboard.press('ArrowRight')
    await expect.poll(() => page.getByTestId('handle-announce').textContent()).toMatch(/^Root 1: reach/)
    const after = await page.getByTestId('handle-announce').textContent()
    const reach = (s: string | null) => inches(/reach ([^,]+),/.exec(s ?? '')![1]!)
    expect(reach(after) - reach(before)).toBeCloseTo(SHOWN, 1)
    expect(after).toMatch(/ 0\.0° from the axis/)
    await page.context().close()
  })
})

describe('sizes', () => {
  it('phone and tablet: no sideways scrolling, handles big enough to touch; screenshots of a bad plate, compare and export', async () => {
    // A bad plate: pockets pushed out to 5 in apart from the centre on a small tube, so they overlap.
    const bad = { ...params, tubeDiameter: 317.5, casterCount: 6, casterOffset: 127 }
    const id = await newDesign('Sizes', bad)
    const saved = await api(`/api/designs/${id}/revisions`, { method: 'POST', cookie: designer, body: { params: { ...bad, casterOffset: 150 }, note: 'Wider', basedOn: 1 } })
    expect(saved.status).toBe(201)
    for (const [name, viewport] of [['1440', { width: 1440, height: 900 }], ['1024', { width: 1024, height: 768 }], ['390', { width: 390, height: 844 }]] as const) {
      const page = await open(id, viewport)
      const sideways = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
      expect(sideways, `sideways scroll at ${name}`).toBeLessThanOrEqual(0)
      // WCAG 2.2 success criterion 2.5.8: targets at least 24 by 24 CSS pixels.
      const handle = (await page.locator('[data-handle="lobe-0"]').boundingBox())!
      expect(handle.width).toBeGreaterThanOrEqual(24)
      expect(handle.height).toBeGreaterThanOrEqual(24)
      // The width dimension is drawn inside the canvas: the canvas is not narrower than the plate's drawing needs.
      const canvas = (await page.getByTestId('plate-canvas').boundingBox())!
      expect(canvas.width).toBeGreaterThan(viewport.width < 500 ? 300 : 400)
      await page.screenshot({ path: `${shots}/editor-bad-${name}.png` })
      await page.getByTestId('legend-toggle').click()
      await page.getByTestId('canvas-legend').waitFor()
      await page.getByTestId('plate-canvas').screenshot({ path: `${shots}/editor-legend-${name}.png` })
      await page.getByTestId('legend-toggle').click()
      const items = page.getByTestId('revisions').locator('li')
      await items.nth(0).getByRole('checkbox').check()
      await items.nth(1).getByRole('checkbox').check()
      await page.getByTestId('compare').click()
      await page.getByTestId('compare-table').waitFor()
      await page.getByTestId('plate-canvas').scrollIntoViewIfNeeded()
      await page.screenshot({ path: `${shots}/editor-compare-${name}.png` })
      await page.getByRole('button', { name: 'End compare' }).click()
      const exportHeading = page.getByRole('heading', { name: 'Templates and cut files' })
      await exportHeading.scrollIntoViewIfNeeded()
      await page.screenshot({ path: `${shots}/editor-export-${name}.png` })
      await page.context().close()
    }
  })
})
