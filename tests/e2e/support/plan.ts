// A shop of the sheet plan tests' own with three sizes of one shape (the
// river stone preset on 10-1/2, 12-1/2 and 14-1/2 in tubes, sized by
// deriveForTube), so the tests never touch the demo designs.
import { deriveForTube, presetParams } from '../../../geometry'
import { api } from './api'
import { makeShop, signInAs } from './crew'

export const PLAN_SIZES = [
  { label: 'small', tube: 10.5 },
  { label: 'medium', tube: 12.5 },
  { label: 'large', tube: 14.5 },
] as const

export async function planShop(name: string): Promise<{ cookie: string; email: string; password: string; designIds: string[] }> {
  const { people } = await makeShop(name, [{ role: 'designer', name: 'Plan Designer' }])
  const person = people[0]!
  const cookie = await signInAs(person.email, person.password)
  const base = presetParams('river-stone')!
  const designIds: string[] = []
  for (const size of PLAN_SIZES) {
    const res = await api('/api/designs', {
      method: 'POST',
      cookie,
      body: { name: 'Boulder', sizeLabel: size.label, params: deriveForTube(base, size.tube * 25.4) },
    })
    if (res.status !== 201) throw new Error(`design answered ${res.status}: ${JSON.stringify(res.body)}`)
    designIds.push(res.body.id)
  }
  return { cookie, email: person.email, password: person.password, designIds }
}
