// The query limits of the export routes (server/services/exports.ts; lengths
// in mm): each bound is taken, one step past it is a 422 naming the field, and
// a few accepted values are read back from the file (pdf-lib, dxf-parser) to
// show the server honours them. The bounds are our own choices; paper sizes
// are ISO 216 and ASME Y14.1, DXF units the DXF Reference (REFERENCES.md).
import DxfParser from 'dxf-parser'
import { PDFDocument } from 'pdf-lib'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { api, signIn } from './support/api'

let cookie = ''
let revisionId = ''

beforeAll(async () => {
  const designer = await signIn('designer@rootplate.test')
  const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Export limits stump', params: { tubeDiameter: 304.8 } } })
  expect(created.status).toBe(201)
  revisionId = created.body.revision.id
  cookie = await signIn('viewer@rootplate.test')
})

async function get(file: string, query: string) {
  return fetch(`${inject('baseUrl')}/api/revisions/${revisionId}/${file}?${query}`, { headers: { cookie } })
}

async function refused(file: string, query: string, field: string, message: RegExp) {
  const res = await api(`/api/revisions/${revisionId}/${file}?${query}`, { cookie })
  expect(res.status, `${file}?${query}`).toBe(422)
  expect(res.body.data.fields[field], JSON.stringify(res.body.data.fields)).toMatch(message)
}

async function accepted(file: string, query: string) {
  const res = await get(file, query)
  expect(res.status, `${file}?${query}: ${res.status === 200 ? '' : await res.clone().text()}`).toBe(200)
  return res
}

describe('template.pdf query limits', () => {
  it('takes a margin of 0 and 30 mm, an overlap of 0 and 50 mm; refuses 30.1, 50.1, negatives and words', async () => {
    for (const q of ['margin=0', 'margin=30', 'overlap=0', 'overlap=50']) await accepted('template.pdf', q)
    await refused('template.pdf', 'margin=30.1', 'margin', /at most 30 mm/)
    await refused('template.pdf', 'overlap=50.1', 'overlap', /at most 50 mm/)
    await refused('template.pdf', 'margin=-1', 'margin', /negative/)
    await refused('template.pdf', 'overlap=lots', 'overlap', /number of millimetres/)
  })

  it('takes every paper it offers, printed at its real size; refuses another', async () => {
    // A3 is 297 x 420 mm = 841.89 x 1190.55 pt (ISO 216; 1 pt = 1/72 in, ISO 32000-1).
    const res = await accepted('template.pdf', 'paper=a3&orientation=portrait')
    const doc = await PDFDocument.load(new Uint8Array(await res.arrayBuffer()))
    const sizes = doc.getPages().map(p => p.getSize())
    expect(sizes.some(s => Math.abs(s.width - 841.89) < 0.05 && Math.abs(s.height - 1190.55) < 0.05)).toBe(true)
    await refused('template.pdf', 'paper=b5', 'paper', /Paper must be one of/)
    await refused('template.pdf', 'orientation=sideways', 'orientation', /auto, portrait or landscape/)
    await refused('template.pdf', 'units=cm', 'units', /in or mm/)
  })

  it('a guide bushing: both sizes or neither, the bushing wider than the bit, at most 60 and 50 mm', async () => {
    await accepted('template.pdf', 'bushing=60&bit=50')
    await refused('template.pdf', 'bushing=60.1&bit=6', 'bushing', /at most 60 mm/)
    await refused('template.pdf', 'bushing=59&bit=50.1', 'bit', /at most 50 mm/)
    await refused('template.pdf', 'bushing=15.875', 'bit', /both/)
    await refused('template.pdf', 'bit=6.35', 'bushing', /both/)
    await refused('template.pdf', 'bushing=6.35&bit=6.35', 'bushing', /wider than the bit/)
  })
})

describe('tube-wrap.pdf query limits', () => {
  it('takes a strip 25 to 600 mm tall; refuses 24.9 and 600.1', async () => {
    for (const q of ['height=25', 'height=600']) await accepted('tube-wrap.pdf', q)
    await refused('tube-wrap.pdf', 'height=24.9', 'height', /at least 25 mm/)
    await refused('tube-wrap.pdf', 'height=600.1', 'height', /at most 600 mm/)
    await refused('tube-wrap.pdf', 'margin=31', 'margin', /at most 30 mm/)
  })
})

describe('cut.dxf and cut.svg query limits', () => {
  it('units in or mm, written into the header ($INSUNITS 1 and 4, DXF Reference, HEADER); refuses others', async () => {
    for (const [units, code] of [['in', 1], ['mm', 4]] as const) {
      const dxf = new DxfParser().parseSync(await (await accepted('cut.dxf', `units=${units}`)).text())
      expect(dxf?.header.$INSUNITS).toBe(code)
    }
    await refused('cut.dxf', 'units=ft', 'units', /in or mm/)
    await refused('cut.svg', 'units=px', 'units', /in or mm/)
  })

  it('reference and mirror take true, false, 1 or 0; anything else is refused', async () => {
    const withRef = new DxfParser().parseSync(await (await accepted('cut.dxf', 'reference=1')).text())
    const without = new DxfParser().parseSync(await (await accepted('cut.dxf', 'reference=false')).text())
    const layers = (d: typeof withRef) => new Set(d!.entities.map(e => e.layer))
    // Leaving out the reference marks leaves fewer layers, and none that the full file lacks.
    expect(layers(without).size).toBeLessThan(layers(withRef).size)
    for (const l of layers(without)) expect(layers(withRef).has(l)).toBe(true)
    await accepted('cut.svg', 'mirror=0')
    await refused('cut.dxf', 'reference=maybe', 'reference', /.+/)
    await refused('cut.svg', 'mirror=yes', 'mirror', /.+/)
  })
})
