// Every route's guard, cell by cell (issue 27): each route file under
// server/api x each role (lead, designer, builder, viewer) x (own shop, other
// shop) plus signed out, through HTTP against the built test server.
//
// The expectations come from the README's role table ("Demo accounts": who
// may do what) and its tour, not from shared/utils/permissions.ts: a route
// opened to a role the README does not give it, or to another shop, fails
// here. The route list is read from the file system, so a new route file
// without an entry in GUARDS fails the first test and names itself.
//
// Cells: own shop -> success when the README lets the role act, else 403;
// other shop (a member of a second shop asking for the first shop's thing)
// -> 404 when the role could act in its own shop, else 403 or 404 (refused
// either way; the role check may come before or after the lookup); signed
// out -> 401. Public routes answer every cell the same. Routes that act on
// the caller alone (`self`) succeed for every member of either shop.
// Every change lands on data this file owns: two shops of its own, and a
// fresh design, unit, loan, share, invitation or member per cell where the
// request uses it up.
import { execFileSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { beforeAll, describe, expect, it, inject } from 'vitest'
import { createDatabase } from '../../server/utils/db'
import { memberships, users } from '../../server/database/schema'
import { hasher } from '../../scripts/seed'
import { api, freshAddress } from './support/api'
import { makeShop, signInAs, uniqueEmail, type TestPerson } from './support/crew'
import { makePng, upload } from './support/files'
import { waitForMail } from './support/mail'
import { apiRoutes } from './support/routes'

const roles = ['lead', 'designer', 'builder', 'viewer'] as const
type Role = (typeof roles)[number]
type Side = 'own' | 'other'
interface Cell { side: Side; role: Role }
const cellName = (c: Cell | null) => (c ? `${c.side} ${c.role}` : 'signed out')

// ---------------------------------------------------------------------------
// What each role may do, as the README says it (README.md, "Demo accounts"
// table and "A short tour"). The test "the capability table agrees with the
// README" re-reads those lines, so the table cannot drift from them silently.
// ---------------------------------------------------------------------------
const CAN = {
  // Every role "read[s] designs and their history" (viewer and builder rows; lead: "everything"; the designer creates them).
  read: ['lead', 'designer', 'builder', 'viewer'],
  // Designer row: "create designs, save revisions"; tour 8: the designer attaches sketches and places them; lead: everything.
  // Sizes, details, shows and share links are the same work on designs (not named per role in the README).
  shape: ['lead', 'designer'],
  // Builder row: "record built units and patterns, their stages, loans and photos". The README names no unit right for
  // the designer; DEVELOPERS ("Uploads and the unit register") gives it to lead, designer and builder.
  units: ['lead', 'designer', 'builder'],
  // Lead row: "everything, and see the crew"; tour (shop set-up) 7: the lead invites, changes roles, reads Activity and Mail.
  crew: ['lead'],
  // Tour 13: "anyone can leave a comment on the revision".
  comment: ['lead', 'designer', 'builder', 'viewer'],
} as const satisfies Record<string, readonly Role[]>
type Capability = keyof typeof CAN

/** Who may call a route: a capability, any signed-in member acting on themself, or anyone (`public`, with the one status every cell gets). */
type Who = Capability | 'self' | { public: number }

interface Target {
  path: string
  body?: unknown
  /** A file to send as multipart (field `file`) instead of a JSON body. */
  file?: Uint8Array
  /** A cookie of the cell's own (a fresh member of the same shop and role), for requests that end or change the session. */
  cookie?: string
  /** The shop-scoped value to look at after a refused cell: it must still be there (checked with the owner's cookie). */
  stillThere?: string
  /** Text of the first shop that no answer to another shop or to a visitor may carry (PDFs read through pdftotext). */
  secret?: string
}

interface Guard {
  /** `METHOD /api/path/[param]` as the file lies under server/api. */
  route: string
  who: Who
  /** Builds the request of one cell (null = signed out); called once per cell. */
  target: (cell: Cell | null) => Promise<Target>
  /** Whether the path names a thing of the first shop (other shop: 404); default: the path has a [param]. */
  scoped?: boolean
  /** Run the cells one after the other (exports, which a pool may queue). */
  serial?: boolean
  /** Extra label when one route has several entries. */
  variant?: string
  /** What an allowed role of the other shop gets when the first shop's id is in the body, not the path (default 404). */
  foreign?: number
}

// ---------------------------------------------------------------------------
// Fixtures: two shops of this file's own, one member of each role in each.
// ---------------------------------------------------------------------------
interface ShopFixture { shopId: string; people: Record<Role, TestPerson>; cookies: Record<Role, string> }
let home: ShopFixture
let away: ShopFixture
let design: { id: string; revisionId: string; name: string }
let attachmentId = ''
let unitId = ''
let unitLabel = ''
let showId = ''
let shareToken = ''
let invitationToken = ''
let passwordHash = ''
const png = makePng(16, 12, [{ x: 8, y: 6, r: 3 }])
const today = new Date().toISOString().slice(0, 10)

async function shopOf(name: string, folk: string): Promise<ShopFixture> {
  const made = await makeShop(name, roles.map(role => ({ role, name: `${folk} ${role}` })))
  const people = {} as Record<Role, TestPerson>
  const cookies = {} as Record<Role, string>
  for (const [i, role] of roles.entries()) {
    people[role] = made.people[i]!
    cookies[role] = await signInAs(people[role].email, people[role].password)
  }
  return { shopId: made.shopId, people, cookies }
}

const owner = () => home.cookies.lead
const fixtureOf = (side: Side) => (side === 'own' ? home : away)

async function must<T = any>(res: Promise<{ status: number; body: T }>, what: string): Promise<T> {
  const r = await res
  if (r.status >= 300) throw new Error(`set-up (${what}) answered ${r.status}: ${JSON.stringify(r.body)}`)
  return r.body
}

/** A member of the shop with the role, of this cell alone; returns the person and a signed-in cookie. */
async function freshMember(shopId: string, role: Role): Promise<{ id: string; email: string; password: string; cookie: string }> {
  const db = createDatabase(inject('databaseUrl'))
  const email = uniqueEmail(`guard-${role}`)
  try {
    const [user] = await db.insert(users).values({ email, name: `Fresh ${role}`, passwordHash }).returning()
    await db.insert(memberships).values({ userId: user!.id, shopId, role })
    return { id: user!.id, email, password: 'guard-fresh-pass', cookie: await signInAs(email, 'guard-fresh-pass') }
  }
  finally {
    await db.$client.end()
  }
}
const cellCookie = async (cell: Cell | null) => (cell ? (await freshMember(fixtureOf(cell.side).shopId, cell.role)).cookie : undefined)

const newDesign = async (name = 'Guard beech') => {
  const body = await must(api('/api/designs', { method: 'POST', cookie: owner(), body: { name, params: {} } }), 'design')
  return { id: body.id as string, revisionId: body.revision.id as string, name }
}
const tag = () => crypto.randomUUID().slice(0, 8)
const newUnit = async (label = `Guard ${tag()}`) => (await must(api('/api/units', { method: 'POST', cookie: owner(), body: { kind: 'pattern', label } }), 'unit')).id as string
const newLoanedUnit = async () => {
  const id = await newUnit()
  await must(api(`/api/units/${id}/loans`, { method: 'POST', cookie: owner(), body: { borrower: 'Harbour Lane', outOn: today, dueOn: today } }), 'loan')
  return id
}
const newAttachment = async (designId = design.id) => (await must(upload(`/api/designs/${designId}/attachments`, png, 'guard.png', { cookie: owner() }), 'attachment')).id as string
const newShare = async () => (await must(api(`/api/revisions/${design.revisionId}/shares`, { method: 'POST', cookie: owner(), body: { days: 1 } }), 'share')) as { id: string; url: string }
const newInvitation = async (email = uniqueEmail('guard-invite')) => (await must(api('/api/shop/invitations', { method: 'POST', cookie: owner(), body: { email, role: 'viewer' } }), 'invitation')).id as string
const newSize = async () => {
  const parent = await newDesign()
  const sizes = await must(api(`/api/designs/${parent.id}/sizes`, { method: 'POST', cookie: owner(), body: { sizes: [{ label: 'Small', tubeDiameter: 280 }] } }), 'sizes')
  return { parent: parent.id, size: sizes[0].id as string }
}
const sheetBody = () => ({
  items: [{ designId: design.id, count: 1 }],
  sheet: { width: 48 * 25.4, height: 96 * 25.4, thickness: 18, margin: 12.7, kerf: 6.35 },
  workflow: 'panels',
})
const otherToken = 'A'.repeat(43)

// ---------------------------------------------------------------------------
// The table: one entry (or more) per route file. A new route adds a line here.
// ---------------------------------------------------------------------------
const GUARDS: Guard[] = [
  // Sign-in and sessions
  { route: 'GET /api/health', who: { public: 200 }, target: async () => ({ path: '/api/health' }) },
  { route: 'GET /api/_auth/session', who: { public: 200 }, target: async () => ({ path: '/api/_auth/session' }) },
  { route: 'DELETE /api/_auth/session', who: { public: 200 }, target: async c => ({ path: '/api/_auth/session', cookie: await cellCookie(c) }) },
  { route: 'POST /api/auth/login', who: { public: 200 }, target: async c => ({ path: '/api/auth/login', cookie: await cellCookie(c), body: { email: home.people.viewer.email, password: home.people.viewer.password } }) },
  { route: 'POST /api/auth/logout', who: { public: 200 }, target: async c => ({ path: '/api/auth/logout', cookie: await cellCookie(c) }) },
  { route: 'POST /api/auth/forgot', who: { public: 202 }, target: async () => ({ path: '/api/auth/forgot', body: { email: uniqueEmail('nobody') } }) },
  { route: 'POST /api/auth/reset', who: { public: 404 }, target: async () => ({ path: '/api/auth/reset', body: { token: otherToken, password: 'a long enough new password 1' } }) },
  { route: 'POST /api/auth/logout-everywhere', who: 'self', target: async c => ({ path: '/api/auth/logout-everywhere', cookie: await cellCookie(c) }) },
  { route: 'POST /api/auth/shop', who: 'self', target: async c => ({ path: '/api/auth/shop', cookie: await cellCookie(c), body: { shopId: fixtureOf(c?.side ?? 'own').shopId } }) },
  { route: 'GET /api/invitations/[token]', who: { public: 200 }, target: async () => ({ path: `/api/invitations/${invitationToken}` }) },
  { route: 'POST /api/invitations/[token]/accept', who: { public: 404 }, target: async () => ({ path: `/api/invitations/${otherToken}/accept`, body: { name: 'Nobody', password: 'a long enough new password 1' } }) },
  { route: 'GET /api/shared/[token]', who: { public: 200 }, target: async () => ({ path: `/api/shared/${shareToken}` }) },

  // The caller's own account
  { route: 'GET /api/me', who: 'self', target: async () => ({ path: '/api/me' }) },
  { route: 'GET /api/me/shops', who: 'self', target: async () => ({ path: '/api/me/shops' }) },
  { route: 'PATCH /api/me/preferences', who: 'self', target: async c => ({ path: '/api/me/preferences', cookie: await cellCookie(c), body: { units: 'mm' } }) },
  {
    route: 'POST /api/me/password', who: 'self', target: async (c) => {
      if (!c) return { path: '/api/me/password', body: { current: 'guard-fresh-pass', password: 'another long password 7' } }
      const m = await freshMember(fixtureOf(c.side).shopId, c.role)
      return { path: '/api/me/password', cookie: m.cookie, body: { current: m.password, password: 'another long password 7' } }
    },
  },

  // Designs
  { route: 'GET /api/designs', who: 'read', scoped: false, target: async () => ({ path: '/api/designs', secret: design.id }) },
  { route: 'POST /api/designs', who: 'shape', scoped: false, target: async () => ({ path: '/api/designs', body: { name: 'Guard new', params: {} } }) },
  { route: 'GET /api/designs/[id]', who: 'read', target: async () => ({ path: `/api/designs/${design.id}` }) },
  { route: 'PATCH /api/designs/[id]', who: 'shape', target: async () => ({ path: `/api/designs/${design.id}`, body: { quantity: 2 } }) },
  { route: 'GET /api/designs/[id]/revisions', who: 'read', target: async () => ({ path: `/api/designs/${design.id}/revisions` }) },
  {
    route: 'POST /api/designs/[id]/revisions', who: 'shape', target: async () => {
      const d = await newDesign()
      return { path: `/api/designs/${d.id}/revisions`, body: { params: { tubeDiameter: 320 }, note: 'guard', basedOn: 1 }, stillThere: `/api/designs/${d.id}` }
    },
  },
  { route: 'GET /api/designs/[id]/attachments', who: 'read', target: async () => ({ path: `/api/designs/${design.id}/attachments` }) },
  { route: 'POST /api/designs/[id]/attachments', who: 'shape', target: async () => ({ path: `/api/designs/${design.id}/attachments`, file: png }) },
  { route: 'GET /api/designs/[id]/reference', who: 'read', target: async () => ({ path: `/api/designs/${design.id}/reference` }) },
  { route: 'PUT /api/designs/[id]/reference', who: 'shape', target: async () => ({ path: `/api/designs/${design.id}/reference`, body: { attachmentId, x: 0, y: 0, rotation: 0, mmPerPixel: 2, opacity: 0.5 } }) },
  {
    route: 'DELETE /api/designs/[id]/reference', who: 'shape', target: async () => {
      const d = await newDesign()
      const a = await newAttachment(d.id)
      await must(api(`/api/designs/${d.id}/reference`, { method: 'PUT', cookie: owner(), body: { attachmentId: a, x: 0, y: 0, rotation: 0, mmPerPixel: 2, opacity: 0.5 } }), 'reference')
      return { path: `/api/designs/${d.id}/reference`, stillThere: `/api/designs/${d.id}/reference` }
    },
  },
  { route: 'GET /api/designs/[id]/family', who: 'read', target: async () => ({ path: `/api/designs/${design.id}/family` }) },
  { route: 'POST /api/designs/[id]/sizes', who: 'shape', target: async () => ({ path: `/api/designs/${design.id}/sizes`, body: { sizes: [{ label: 'Tiny', tubeDiameter: 250 }] } }) },
  {
    route: 'POST /api/designs/[id]/sizes/update', who: 'shape', target: async () => {
      const { parent, size } = await newSize()
      await must(api(`/api/designs/${parent}/revisions`, { method: 'POST', cookie: owner(), body: { params: { tubeDiameter: 330 }, note: 'wider', basedOn: 1 } }), 'parent save')
      return { path: `/api/designs/${parent}/sizes/update`, body: { parentRevision: 2, sizes: [{ id: size, basedOn: 1 }] } }
    },
  },
  {
    route: 'POST /api/designs/[id]/detach', who: 'shape', target: async () => {
      const { size } = await newSize()
      return { path: `/api/designs/${size}/detach`, stillThere: `/api/designs/${size}` }
    },
  },
  { route: 'GET /api/designs/[id]/unit-counts', who: 'read', target: async () => ({ path: `/api/designs/${design.id}/unit-counts` }) },

  // Revisions and their files
  { route: 'GET /api/revisions/[id]', who: 'read', target: async () => ({ path: `/api/revisions/${design.revisionId}` }) },
  { route: 'GET /api/revisions/[id]/template.pdf', who: 'read', serial: true, target: async () => ({ path: `/api/revisions/${design.revisionId}/template.pdf` }) },
  { route: 'GET /api/revisions/[id]/tube-wrap.pdf', who: 'read', serial: true, target: async () => ({ path: `/api/revisions/${design.revisionId}/tube-wrap.pdf` }) },
  { route: 'GET /api/revisions/[id]/cut.dxf', who: 'read', serial: true, target: async () => ({ path: `/api/revisions/${design.revisionId}/cut.dxf` }) },
  { route: 'GET /api/revisions/[id]/cut.svg', who: 'read', serial: true, target: async () => ({ path: `/api/revisions/${design.revisionId}/cut.svg` }) },
  { route: 'GET /api/revisions/[id]/build-sheet.pdf', who: 'read', serial: true, target: async () => ({ path: `/api/revisions/${design.revisionId}/build-sheet.pdf` }) },
  { route: 'GET /api/revisions/[id]/skirt-profiles.pdf', who: 'read', serial: true, target: async () => ({ path: `/api/revisions/${design.revisionId}/skirt-profiles.pdf` }) },
  { route: 'GET /api/revisions/[id]/comments', who: 'read', target: async () => ({ path: `/api/revisions/${design.revisionId}/comments` }) },
  { route: 'POST /api/revisions/[id]/comments', who: 'comment', target: async () => ({ path: `/api/revisions/${design.revisionId}/comments`, body: { body: 'Guard note' } }) },
  { route: 'GET /api/revisions/[id]/shares', who: 'shape', target: async () => ({ path: `/api/revisions/${design.revisionId}/shares` }) },
  { route: 'POST /api/revisions/[id]/shares', who: 'shape', target: async () => ({ path: `/api/revisions/${design.revisionId}/shares`, body: { days: 1 } }) },
  { route: 'DELETE /api/shares/[id]', who: 'shape', target: async () => ({ path: `/api/shares/${(await newShare()).id}`, stillThere: `/api/revisions/${design.revisionId}/shares` }) },

  // Files on designs and units
  { route: 'GET /api/attachments/[id]/file', who: 'read', target: async () => ({ path: `/api/attachments/${attachmentId}/file` }) },
  {
    route: 'DELETE /api/attachments/[id]', variant: 'a design\'s reference image', who: 'shape', target: async () => {
      const d = await newDesign()
      const a = await newAttachment(d.id)
      await must(api(`/api/designs/${d.id}/reference`, { method: 'PUT', cookie: owner(), body: { attachmentId: a, x: 0, y: 0, rotation: 0, mmPerPixel: 2, opacity: 0.5 } }), 'reference')
      return { path: `/api/attachments/${a}`, stillThere: `/api/attachments/${a}/file` }
    },
  },
  {
    route: 'DELETE /api/attachments/[id]', variant: 'a unit\'s photo', who: 'units', target: async () => {
      const u = await newUnit()
      const photo = await must(upload(`/api/units/${u}/photos`, png, 'built.png', { cookie: owner() }), 'photo')
      return { path: `/api/attachments/${photo.id}`, stillThere: `/api/attachments/${photo.id}/file` }
    },
  },

  // The unit register
  { route: 'GET /api/units', who: 'read', scoped: false, target: async () => ({ path: '/api/units', secret: unitId }) },
  { route: 'POST /api/units', who: 'units', scoped: false, target: async () => ({ path: '/api/units', body: { kind: 'pattern', label: `Guard pattern ${tag()}` } }) },
  // Another shop's design named in the body is a field error (422 on designId), and nothing is made.
  { route: 'POST /api/units', variant: 'built from a design', who: 'units', scoped: true, foreign: 422, target: async () => ({ path: '/api/units', body: { kind: 'plate', label: `Guard unit ${tag()}`, designId: design.id, revisionId: design.revisionId } }) },
  { route: 'GET /api/units/overdue', who: 'read', scoped: false, target: async () => ({ path: '/api/units/overdue' }) },
  { route: 'GET /api/units/labels.pdf', who: 'read', scoped: false, serial: true, target: async () => ({ path: '/api/units/labels.pdf', secret: unitLabel }) },
  // Another shop's ids are left out of the sheet (it prints its own shop's, here none): never the first shop's label.
  { route: 'GET /api/units/labels.pdf', variant: 'listed units', who: 'read', scoped: false, serial: true, target: async () => ({ path: `/api/units/labels.pdf?ids=${unitId}`, secret: unitLabel }) },
  { route: 'GET /api/units/[id]', who: 'read', target: async () => ({ path: `/api/units/${unitId}` }) },
  { route: 'PATCH /api/units/[id]', who: 'units', target: async () => ({ path: `/api/units/${unitId}`, body: { location: 'Bay 2' } }) },
  { route: 'POST /api/units/[id]/photos', who: 'units', target: async () => ({ path: `/api/units/${unitId}/photos`, file: png }) },
  {
    route: 'POST /api/units/[id]/loans', who: 'units', target: async () => {
      const u = await newUnit()
      return { path: `/api/units/${u}/loans`, body: { borrower: 'Harbour Lane', outOn: today, dueOn: today }, stillThere: `/api/units/${u}` }
    },
  },
  {
    route: 'POST /api/units/[id]/return', who: 'units', target: async () => {
      const u = await newLoanedUnit()
      return { path: `/api/units/${u}/return`, body: { returnedOn: today }, stillThere: `/api/units/${u}` }
    },
  },

  // Shows
  { route: 'GET /api/shows', who: 'read', scoped: false, target: async () => ({ path: '/api/shows', secret: showId }) },
  { route: 'POST /api/shows', who: 'shape', scoped: false, target: async () => ({ path: '/api/shows', body: { name: `Guard show ${crypto.randomUUID().slice(0, 6)}` } }) },
  { route: 'GET /api/shows/[id]', who: 'read', target: async () => ({ path: `/api/shows/${showId}` }) },
  { route: 'PATCH /api/shows/[id]', who: 'shape', target: async () => ({ path: `/api/shows/${showId}`, body: { venue: 'Guard hall' } }) },

  // Sheet plans (the designs named in the body decide the shop)
  { route: 'POST /api/sheet-plans', who: 'read', scoped: true, serial: true, target: async () => ({ path: '/api/sheet-plans', body: sheetBody() }) },
  { route: 'POST /api/sheet-plans/layouts.pdf', who: 'read', scoped: true, serial: true, target: async () => ({ path: '/api/sheet-plans/layouts.pdf', body: { ...sheetBody(), units: 'in' } }) },
  { route: 'POST /api/sheet-plans/sheet.dxf', who: 'read', scoped: true, serial: true, target: async () => ({ path: '/api/sheet-plans/sheet.dxf', body: { ...sheetBody(), units: 'in', index: 0 } }) },

  // The crew
  { route: 'GET /api/shop/members', who: 'crew', scoped: false, target: async () => ({ path: '/api/shop/members', secret: home.people.viewer.email }) },
  {
    route: 'PATCH /api/shop/members/[id]', who: 'crew', target: async () => {
      const m = await freshMember(home.shopId, 'viewer')
      return { path: `/api/shop/members/${m.id}`, body: { role: 'builder' } }
    },
  },
  {
    route: 'DELETE /api/shop/members/[id]', who: 'crew', target: async () => {
      const m = await freshMember(home.shopId, 'viewer')
      return { path: `/api/shop/members/${m.id}` }
    },
  },
  { route: 'GET /api/shop/invitations', who: 'crew', scoped: false, target: async () => ({ path: '/api/shop/invitations' }) },
  { route: 'POST /api/shop/invitations', who: 'crew', scoped: false, target: async () => ({ path: '/api/shop/invitations', body: { email: uniqueEmail('guard-new'), role: 'viewer' } }) },
  { route: 'DELETE /api/shop/invitations/[id]', who: 'crew', target: async () => ({ path: `/api/shop/invitations/${await newInvitation()}` }) },
  { route: 'POST /api/shop/invitations/[id]/resend', who: 'crew', target: async () => ({ path: `/api/shop/invitations/${await newInvitation()}/resend` }) },
  { route: 'GET /api/shop/activity', who: 'crew', scoped: false, target: async () => ({ path: '/api/shop/activity', secret: 'Homefield lead' }) },
  { route: 'GET /api/dev/mail', who: 'crew', scoped: false, target: async () => ({ path: '/api/dev/mail' }) },
]

// ---------------------------------------------------------------------------

/** Every route file under server/api, as `METHOD /api/path/[param]`. */
function routeFiles(): string[] {
  return apiRoutes().map(r => `${r.method} ${r.template}`).sort()
}

/** What a cell must answer: a status, or `ok` (any 2xx). */
function expected(g: Guard, cell: Cell | null): number | 'ok' | 'refused' {
  if (typeof g.who === 'object') return g.who.public === 200 || g.who.public === 202 ? 'ok' : g.who.public
  if (!cell) return 401
  if (g.who === 'self') return 'ok'
  const may = (CAN[g.who] as readonly Role[]).includes(cell.role)
  const scoped = g.scoped ?? g.route.includes('[')
  if (cell.side === 'own' || !scoped) return may ? 'ok' : 403
  return may ? (g.foreign ?? 404) : 'refused'
}

function matches(want: number | 'ok' | 'refused', got: number): boolean {
  if (want === 'ok') return got >= 200 && got < 300
  if (want === 'refused') return got === 403 || got === 404
  return got === want
}

/** The answer's status and its text (a PDF's through poppler's pdftotext). */
async function send(t: Target, method: string, cookie: string | undefined): Promise<{ status: number; text: string }> {
  if (t.file) {
    const res = await upload(t.path, t.file, 'guard.png', { cookie })
    return { status: res.status, text: JSON.stringify(res.body) }
  }
  const headers: Record<string, string> = { 'x-forwarded-for': freshAddress() }
  if (cookie) headers.cookie = cookie
  const body = t.body ?? (method === 'GET' || method === 'DELETE' ? undefined : {})
  if (body !== undefined) headers['content-type'] = 'application/json'
  const res = await fetch(`${inject('baseUrl')}${t.path}`, { method, headers, body: body === undefined ? undefined : JSON.stringify(body), redirect: 'manual' })
  const bytes = Buffer.from(await res.arrayBuffer())
  const text = res.headers.get('content-type')?.includes('pdf') && res.ok
    ? execFileSync('pdftotext', ['-', '-'], { input: bytes }).toString('utf8')
    : bytes.toString('utf8')
  return { status: res.status, text }
}

const cells: (Cell | null)[] = [
  ...roles.map(role => ({ side: 'own' as const, role })),
  ...roles.map(role => ({ side: 'other' as const, role })),
  null,
]

async function runCell(g: Guard, cell: Cell | null): Promise<string | null> {
  const method = g.route.split(' ')[0]!
  const t = await g.target(cell)
  const cookie = t.cookie ?? (cell ? fixtureOf(cell.side).cookies[cell.role] : undefined)
  const { status: got, text } = await send(t, method, cookie)
  const want = expected(g, cell)
  if (t.secret && cell?.side !== 'own' && text.includes(t.secret)) return `${cellName(cell)}: the answer carries the first shop's ${t.secret}`
  // The same text is in the first shop's own answer, so the look above can find it.
  if (t.secret && cell?.side === 'own' && matches('ok', got) && !text.includes(t.secret)) return `${cellName(cell)}: its own answer lacks ${t.secret}, so the leak check could not see it`
  if (!matches(want, got)) return `${cellName(cell)}: answered ${got}, expected ${want === 'ok' ? 'success' : want === 'refused' ? '403 or 404' : want}`
  // A refused change left the thing in place.
  if (!matches('ok', got) && t.stillThere) {
    const after = await api(t.stillThere, { cookie: owner() })
    if (after.status !== 200) return `${cellName(cell)}: refused, but ${t.stillThere} then answered ${after.status}`
  }
  return null
}

beforeAll(async () => {
  passwordHash = await hasher.make('guard-fresh-pass')
  ;[home, away] = await Promise.all([shopOf(`Guard Home Players ${process.pid}`, 'Homefield'), shopOf(`Guard Away Theatre ${process.pid}`, 'Awayfield')])
  design = await newDesign(`Guard elm ${tag()}`)
  attachmentId = await newAttachment()
  unitLabel = `Guard label ${tag()}`
  unitId = await newUnit(unitLabel)
  showId = (await must(api('/api/shows', { method: 'POST', cookie: owner(), body: { name: 'Guard festival' } }), 'show')).id
  shareToken = (await newShare()).url.split('/').pop()!
  const invitee = uniqueEmail('guard-read')
  await newInvitation(invitee)
  invitationToken = (await waitForMail(invitee, /./)).link.split('/').pop()!
}, 120_000)

describe('the route table', () => {
  it('has an entry for every route file under server/api, and no entry for a route that is gone', () => {
    const files = routeFiles()
    const listed = new Set(GUARDS.map(g => g.route))
    const missing = files.filter(r => !listed.has(r))
    const stale = [...listed].filter(r => !files.includes(r))
    expect(missing, `route files with no entry in GUARDS (tests/e2e/route-guards.test.ts): ${missing.join(', ')}`).toEqual([])
    expect(stale, `entries in GUARDS with no route file: ${stale.join(', ')}`).toEqual([])
  })

  it('the capability table agrees with the README\'s role table', () => {
    const readme = readFileSync(fileURLToPath(new URL('../../README.md', import.meta.url)), 'utf8')
    const section = readme.split('## Demo accounts')[1]!.split('\n## ')[0]!
    const rows = Object.fromEntries([...section.matchAll(/^\| `[^`]+` \| (\w+) \| (.+) \|$/gm)].map(m => [m[1]!, m[2]!]))
    expect(Object.keys(rows).sort()).toEqual([...roles].sort())
    expect(rows.lead).toMatch(/everything/)
    expect(rows.lead).toMatch(/crew/)
    for (const r of ['designer', 'builder', 'viewer']) expect(rows[r]).not.toMatch(/crew|everything/)
    expect(rows.designer).toMatch(/create designs/)
    for (const r of ['builder', 'viewer']) expect(rows[r]).toMatch(/read designs/)
    for (const r of ['builder', 'viewer']) expect(rows[r]).not.toMatch(/create|save/)
    expect(rows.builder).toMatch(/units.*loans.*photos/)
    expect(rows.viewer).not.toMatch(/record|units/)
    expect(readme).toMatch(/anyone can leave a comment/)
    // Each capability as the rows above say it.
    expect(CAN.crew).toEqual(['lead'])
    expect(CAN.shape).toEqual(['lead', 'designer'])
    expect(CAN.units).not.toContain('viewer')
    expect(CAN.units).toContain('builder')
    expect([...CAN.read].sort()).toEqual([...roles].sort())
    expect([...CAN.comment].sort()).toEqual([...roles].sort())
  })
})

describe.each(GUARDS.map(g => [`${g.route}${g.variant ? ` (${g.variant})` : ''}`, g] as const))('%s', (_name, g) => {
  it('answers each role of each shop, and the signed-out visitor, as the README allows', async () => {
    let problems: (string | null)[]
    if (g.serial) {
      problems = []
      for (const c of cells) problems.push(await runCell(g, c))
    }
    else {
      problems = await Promise.all(cells.map(c => runCell(g, c)))
    }
    expect(problems.filter(Boolean)).toEqual([])
  }, 120_000)
})
