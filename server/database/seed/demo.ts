// The demo: an invented community theatre's forest play. Names, sizes and
// numbers are our own. Demo accounts only; never use these passwords for real.
import { eq } from 'drizzle-orm'
import type { Database } from '../../utils/db'
import { activity, designs, memberships, revisions, shops, shows, unitEvents, unitLoans, units, users } from '../schema'
import type { ShopRole } from '../../../shared/utils/permissions'

export const DEMO_PASSWORD = 'rootplate-demo'

export const demoPeople: { email: string; name: string; role: ShopRole }[] = [
  { email: 'lead@rootplate.test', name: 'Morgan Reyes', role: 'lead' },
  { email: 'designer@rootplate.test', name: 'Priya Okafor', role: 'designer' },
  { email: 'builder@rootplate.test', name: 'Sam Lindqvist', role: 'builder' },
  { email: 'viewer@rootplate.test', name: 'Jo Abernathy', role: 'viewer' },
]

const IN = 25.4

/** Three trunks for the show, each with a short history of revisions. */
export function demoDesigns(): { name: string; sizeLabel: string; revisions: { note: string; by: ShopRole; params: Record<string, unknown> }[] }[] {
  // Every trunk runs on the default 2 in casters under 4-1/4 in pans, with the caster offset
  // and the access openings placed so the pans hide under the tube's wall (placeCasters and
  // placeAccess give these numbers) and the plate carries no finding.
  const small = {
    tubeDiameter: 12.5 * IN, casterCount: 3, casterOffset: 90.5, rotation: 90,
    access: { offset: 125.5 },
    lobes: { count: 5, reach: 3 * IN, seed: 7 },
  }
  const medium = { tubeDiameter: 16 * IN, casterCount: 4, casterOffset: 135, rotation: 45, access: { offset: 170 }, lobes: { count: 6, reach: 5 * IN, seed: 21 } }
  const large = { tubeDiameter: 24 * IN, casterCount: 5, casterOffset: 236.5, rotation: 18, access: { offset: 104.5 }, lobes: { count: 7, reach: 7 * IN, seed: 42 } }
  return [
    {
      name: 'Rowan sapling',
      sizeLabel: 'Small · 12 in tube',
      revisions: [
        { note: 'First layout around the 12 in tube', by: 'designer', params: { ...small, lobes: { ...small.lobes, reach: 2.5 * IN } } },
        { note: 'Longer roots downstage so it reads from the balcony', by: 'designer', params: small },
      ],
    },
    {
      name: 'Hollow oak',
      sizeLabel: 'Medium · 16 in tube',
      revisions: [
        { note: 'First layout', by: 'designer', params: { ...medium, casterCount: 3 } },
        { note: 'Four casters: the hollow carries a sandbag', by: 'lead', params: medium },
        { note: 'Pulled one root out toward the bench', by: 'designer', params: { ...medium, lobes: { ...medium.lobes, overrides: [{ index: 2, reach: 7 * IN }] } } },
      ],
    },
    {
      name: 'Old king beech',
      sizeLabel: 'Large · 24 in tube',
      revisions: [
        { note: 'Five casters for the weight of the canopy', by: 'designer', params: large },
        { note: 'Clocked so the index hole faces the wings', by: 'designer', params: { ...large, rotation: 0 } },
      ],
    },
  ]
}

export interface SeedHasher { make(plain: string): Promise<string> }

/**
 * Seeds the demo shop on an empty database; does nothing when any user
 * exists. `normalise` turns each revision's params into what the server
 * would store (the parsed params).
 */
export async function seedDemo(db: Database, hasher: SeedHasher, normalise: (p: Record<string, unknown>) => unknown = p => p): Promise<boolean> {
  const existing = await db.query.users.findFirst({ columns: { id: true } })
  if (existing) return false
  const hash = await hasher.make(DEMO_PASSWORD)
  await db.transaction(async (tx) => {
    const [shop] = await tx.insert(shops).values({ name: 'Alder Street Players' }).returning()
    if (!shop) throw new Error('no shop')
    const people = await tx.insert(users).values(demoPeople.map(p => ({ email: p.email, name: p.name, passwordHash: hash }))).returning()
    const byRole = new Map<ShopRole, string>()
    for (const p of demoPeople) {
      const u = people.find(x => x.email === p.email)
      if (!u) throw new Error(`no user ${p.email}`)
      byRole.set(p.role, u.id)
    }
    await tx.insert(memberships).values(demoPeople.map(p => ({ userId: byRole.get(p.role)!, shopId: shop.id, role: p.role })))
    const [show] = await tx.insert(shows).values({ shopId: shop.id, name: 'Beneath the Rowan Wood', venue: 'Alder Street Hall', opensOn: '2027-03-12' }).returning()
    if (!show) throw new Error('no show')
    const built = new Map<string, { id: string; sizeLabel: string; revisionIds: string[] }>()
    let minute = 0
    const at = () => new Date(Date.UTC(2026, 10, 2, 15, 0) + (minute += 47) * 60_000)
    for (const d of demoDesigns()) {
      const [design] = await tx.insert(designs).values({
        shopId: shop.id, showId: show.id, name: d.name, sizeLabel: d.sizeLabel,
        latestRevision: d.revisions.length, createdBy: byRole.get('designer'),
      }).returning()
      if (!design) throw new Error('no design')
      const first = at()
      let last = first
      const revisionIds: string[] = []
      for (const [i, r] of d.revisions.entries()) {
        last = i === 0 ? first : at()
        const [rev] = await tx.insert(revisions).values({ designId: design.id, number: i + 1, params: normalise(r.params), note: r.note, authorId: byRole.get(r.by), createdAt: last }).returning({ id: revisions.id })
        revisionIds.push(rev!.id)
      }
      built.set(d.name, { id: design.id, sizeLabel: d.sizeLabel, revisionIds })
      await tx.update(designs).set({ createdAt: first, updatedAt: last }).where(eq(designs.id, design.id))
      await tx.insert(activity).values({ shopId: shop.id, userId: byRole.get('designer'), designId: design.id, action: 'design.created', detail: { name: d.name }, createdAt: last })
    }
    await seedDemoUnits(tx, shop.id, byRole.get('builder')!, built)
  })
  return true
}

/** A few built plates and kept patterns of the show, one of them lent to a school. */
type Tx = Parameters<Parameters<Database['transaction']>[0]>[0]

async function seedDemoUnits(db: Tx, shopId: string, builderId: string, built: Map<string, { id: string; sizeLabel: string; revisionIds: string[] }>) {
  const oak = built.get('Hollow oak')
  const rowan = built.get('Rowan sapling')
  if (!oak || !rowan) return
  const rows: { kind: 'plate' | 'pattern'; label: string; design: typeof oak; revision: number; status: 'hardware_fitted' | 'finished' | 'in_stock' | 'on_loan'; location: string; notes?: string }[] = [
    { kind: 'plate', label: 'OAK-M-01', design: oak, revision: 3, status: 'finished', location: 'Scene dock', notes: 'Sandbag pocket in the hollow; two 25 lb bags.' },
    { kind: 'plate', label: 'OAK-M-02', design: oak, revision: 3, status: 'hardware_fitted', location: 'Shop floor, bench 2' },
    { kind: 'pattern', label: 'PAT-OAK-M', design: oak, revision: 3, status: 'in_stock', location: 'Pattern wall, row 2', notes: 'Hardboard, index holes drilled through.' },
    { kind: 'plate', label: 'ROWAN-S-01', design: rowan, revision: 2, status: 'on_loan', location: 'Loft bay 4' },
  ]
  for (const r of rows) {
    const [unit] = await db.insert(units).values({
      shopId, kind: r.kind, label: r.label, designId: r.design.id, revisionId: r.design.revisionIds[r.revision - 1] ?? null,
      sizeLabel: r.design.sizeLabel, status: r.status, location: r.location, notes: r.notes ?? '', createdBy: builderId,
    }).returning()
    if (!unit) throw new Error('no unit')
    await db.insert(unitEvents).values({ unitId: unit.id, userId: builderId, action: 'created', changes: { status: [null, r.status], label: [null, r.label] } })
    if (r.status === 'on_loan') {
      await db.insert(unitLoans).values({ unitId: unit.id, borrower: 'Millbrook High drama club', outOn: '2026-11-20', dueOn: '2027-02-20', createdBy: builderId })
    }
  }
}
