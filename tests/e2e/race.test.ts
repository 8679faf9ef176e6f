import { describe, expect, it } from 'vitest'
import { api, demo, signIn } from './support/api'

describe('racing saves', () => {
  it('of 16 saves on the same base exactly one lands; the rest answer 409 and store nothing', async () => {
    const lead = await signIn(demo.lead)
    const designer = await signIn(demo.designer)
    const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Race stump', params: {} } })
    expect(created.status).toBe(201)
    const id = created.body.id

    const attempts = Array.from({ length: 16 }, (_, i) =>
      api(`/api/designs/${id}/revisions`, { method: 'POST', cookie: i % 2 ? lead : designer, body: { params: { attempt: i }, note: `attempt ${i}`, basedOn: 1 } }))
    const results = await Promise.all(attempts)
    const statuses = results.map(r => r.status)
    expect(statuses.filter(s => s === 201)).toHaveLength(1)
    expect(statuses.filter(s => s === 409)).toHaveLength(15)

    const revisions = await api(`/api/designs/${id}/revisions`, { cookie: lead })
    expect(revisions.body.map((r: { number: number }) => r.number)).toEqual([2, 1])
    const winner = results.find(r => r.status === 201)!
    const latest = await api(`/api/designs/${id}`, { cookie: lead })
    expect(latest.body.latest.id).toBe(winner.body.id)
    expect(latest.body.latest.note).toBe(winner.body.note)
  })

  it('successive saves each on the previous one all land, numbered without gaps', async () => {
    const designer = await signIn(demo.designer)
    const created = await api('/api/designs', { method: 'POST', cookie: designer, body: { name: 'Chain stump', params: {} } })
    let base = 1
    for (let i = 0; i < 5; i++) {
      const res = await api(`/api/designs/${created.body.id}/revisions`, { method: 'POST', cookie: designer, body: { params: { step: i }, note: `step ${i}`, basedOn: base } })
      expect(res.status).toBe(201)
      base = res.body.number
    }
    const revisions = await api(`/api/designs/${created.body.id}/revisions`, { cookie: designer })
    expect(revisions.body.map((r: { number: number }) => r.number)).toEqual([6, 5, 4, 3, 2, 1])
  })
})
