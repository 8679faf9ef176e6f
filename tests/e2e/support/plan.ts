// A shop of the sheet plan tests' own with three sizes of one shape (the
// river stone preset on 10-1/2, 12-1/2 and 14-1/2 in tubes, sized by
// deriveForTube), so the tests never touch the demo designs.
import { inject } from 'vitest'
import { deriveForTube, presetParams } from '../../../geometry'
import { createDatabase } from '../../../server/utils/db'
import { shows } from '../../../server/database/schema'
import { api } from './api'
import { makeShop, signInAs } from './crew'

export const PLAN_SIZES = [
  { label: 'small', tube: 10.5 },
  { label: 'medium', tube: 12.5 },
  { label: 'large', tube: 14.5 },
] as const

/** The shop, its designer's sign-in, the show (invented) the three sizes belong to, and a design outside it. */
export async function planShop(name: string): Promise<{ cookie: string; email: string; password: string; designIds: string[]; showId: string; otherId: string }> {
  const { shopId, people } = await makeShop(name, [{ role: 'designer', name: 'Plan Designer' }])
  const person = people[0]!
  const cookie = await signInAs(person.email, person.password)
  const db = createDatabase(inject('databaseUrl'))
  let showId: string
  try {
    const [show] = await db.insert(shows).values({ shopId, name: 'The Hollow Hill', venue: 'Village hall' }).returning()
    showId = show!.id
  }
  finally {
    await db.$client.end()
  }
  const base = presetParams('river-stone')!
  const designIds: string[] = []
  for (const size of PLAN_SIZES) {
    const res = await api('/api/designs', {
      method: 'POST',
      cookie,
      body: { name: 'Boulder', sizeLabel: size.label, showId, params: deriveForTube(base, size.tube * 25.4) },
    })
    if (res.status !== 201) throw new Error(`design answered ${res.status}: ${JSON.stringify(res.body)}`)
    designIds.push(res.body.id)
  }
  const other = await api('/api/designs', { method: 'POST', cookie, body: { name: 'Lone stump', params: presetParams('slim-birch') } })
  if (other.status !== 201) throw new Error(`design answered ${other.status}`)
  return { cookie, email: person.email, password: person.password, designIds, showId, otherId: other.body.id }
}
