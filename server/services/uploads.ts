import { and, desc, eq } from 'drizzle-orm'
import type { Storage } from 'unstorage'
import type { Database } from '../utils/db'
import { activity, attachments, designReferences, designs, units, users } from '../database/schema'
import type { Actor } from './designs'

export type Owner = { designId: string } | { unitId: string }

export interface AttachmentView {
  id: string
  kind: 'image' | 'pdf'
  contentType: string
  name: string
  size: number
  url: string
  createdAt: Date
  uploadedBy: { id: string | null; name: string | null }
}

export const attachmentUrl = (id: string) => `/api/attachments/${id}/file`

const columns = {
  id: attachments.id,
  kind: attachments.kind,
  contentType: attachments.contentType,
  name: attachments.name,
  size: attachments.size,
  createdAt: attachments.createdAt,
  uploaderId: attachments.uploadedBy,
  uploaderName: users.name,
}
type Row = { id: string; kind: 'image' | 'pdf'; contentType: string; name: string; size: number; createdAt: Date; uploaderId: string | null; uploaderName: string | null }
const view = (r: Row): AttachmentView => ({
  id: r.id, kind: r.kind, contentType: r.contentType, name: r.name, size: r.size, url: attachmentUrl(r.id), createdAt: r.createdAt,
  uploadedBy: { id: r.uploaderId, name: r.uploaderName },
})

async function ownerInShop(db: Database, shopId: string, owner: Owner): Promise<{ designId: string | null } | null> {
  if ('designId' in owner) {
    const d = await db.query.designs.findFirst({ columns: { id: true }, where: and(eq(designs.id, owner.designId), eq(designs.shopId, shopId)) })
    return d ? { designId: d.id } : null
  }
  const u = await db.query.units.findFirst({ columns: { id: true, designId: true }, where: and(eq(units.id, owner.unitId), eq(units.shopId, shopId)) })
  return u ? { designId: u.designId } : null
}

/**
 * Stores the bytes, then the row that names them; when the row cannot be
 * written the bytes are removed again, so nothing is left half-stored.
 * Null when the design or unit is not the shop's.
 */
export async function addAttachment(
  db: Database,
  storage: Storage,
  actor: Actor,
  owner: Owner,
  file: { name: string; bytes: Uint8Array; contentType: string; kind: 'image' | 'pdf' },
): Promise<AttachmentView | null> {
  const found = await ownerInShop(db, actor.shopId, owner)
  if (!found) return null
  const id = crypto.randomUUID()
  const storageKey = `${actor.shopId}:${id}`
  await storage.setItemRaw(storageKey, file.bytes)
  try {
    return await db.transaction(async (tx) => {
      const [row] = await tx.insert(attachments).values({
        id,
        shopId: actor.shopId,
        designId: 'designId' in owner ? owner.designId : null,
        unitId: 'unitId' in owner ? owner.unitId : null,
        kind: file.kind,
        contentType: file.contentType,
        name: file.name,
        size: file.bytes.byteLength,
        storageKey,
        uploadedBy: actor.userId,
      }).returning()
      if (!row) throw new Error('insert returned no attachment')
      await tx.insert(activity).values({
        shopId: actor.shopId, userId: actor.userId, designId: found.designId, action: 'attachment.added',
        detail: { name: file.name, kind: file.kind, ...('unitId' in owner ? { unitId: owner.unitId } : {}) },
      })
      const uploader = await tx.query.users.findFirst({ columns: { name: true }, where: eq(users.id, actor.userId) })
      return view({ ...row, uploaderId: row.uploadedBy, uploaderName: uploader?.name ?? null })
    })
  }
  catch (err: unknown) {
    await storage.removeItem(storageKey).catch(() => {})
    throw err
  }
}

/** Files of one design or unit of the shop, newest first; null when the owner is not the shop's. */
export async function listAttachments(db: Database, shopId: string, owner: Owner): Promise<AttachmentView[] | null> {
  if (!await ownerInShop(db, shopId, owner)) return null
  const rows = await db.select(columns).from(attachments)
    .leftJoin(users, eq(users.id, attachments.uploadedBy))
    .where(and(eq(attachments.shopId, shopId), 'designId' in owner ? eq(attachments.designId, owner.designId) : eq(attachments.unitId, owner.unitId)))
    .orderBy(desc(attachments.createdAt))
  return rows.map(view)
}

export async function findAttachment(db: Database, shopId: string, id: string) {
  return db.query.attachments.findFirst({ where: and(eq(attachments.id, id), eq(attachments.shopId, shopId)) }) ?? null
}

/** The stored bytes of an attachment of the shop, or null. */
export async function readAttachment(db: Database, storage: Storage, shopId: string, id: string) {
  const row = await findAttachment(db, shopId, id)
  if (!row) return null
  const raw = await storage.getItemRaw(row.storageKey)
  if (raw === null || raw === undefined) return { row, bytes: null }
  const bytes = raw instanceof Uint8Array ? raw : raw instanceof ArrayBuffer ? new Uint8Array(raw) : Buffer.from(raw as string)
  return { row, bytes }
}

/** Removes the row first (a missing file is tolerable, a row naming nothing is not), then the bytes. */
export async function removeAttachment(db: Database, storage: Storage, actor: Actor, id: string): Promise<boolean> {
  const row = await db.transaction(async (tx) => {
    const [gone] = await tx.delete(attachments).where(and(eq(attachments.id, id), eq(attachments.shopId, actor.shopId))).returning()
    if (!gone) return null
    let designId = gone.designId
    if (!designId && gone.unitId) designId = (await tx.query.units.findFirst({ columns: { designId: true }, where: eq(units.id, gone.unitId) }))?.designId ?? null
    await tx.insert(activity).values({ shopId: actor.shopId, userId: actor.userId, designId, action: 'attachment.removed', detail: { name: gone.name } })
    return gone
  })
  if (!row) return false
  await storage.removeItem(row.storageKey).catch(() => {})
  return true
}

// ---- Reference image under the plate ----

export interface ReferenceInput { attachmentId: string; x: number; y: number; rotation: number; mmPerPixel: number; opacity: number }

export async function getReference(db: Database, shopId: string, designId: string) {
  const [row] = await db.select({
    attachmentId: designReferences.attachmentId, x: designReferences.x, y: designReferences.y, rotation: designReferences.rotation,
    mmPerPixel: designReferences.mmPerPixel, opacity: designReferences.opacity, updatedAt: designReferences.updatedAt,
  }).from(designReferences)
    .innerJoin(designs, eq(designs.id, designReferences.designId))
    .where(and(eq(designReferences.designId, designId), eq(designs.shopId, shopId)))
  return row ? { ...row, url: attachmentUrl(row.attachmentId) } : null
}

export type ReferenceResult = { ok: true; reference: NonNullable<Awaited<ReturnType<typeof getReference>>> } | { ok: false; reason: 'not-found' | 'bad-attachment' }

/** Places (or moves) the design's reference image; it must be an image attached to that design. */
export async function setReference(db: Database, actor: Actor, designId: string, input: ReferenceInput): Promise<ReferenceResult> {
  const design = await db.query.designs.findFirst({ columns: { id: true }, where: and(eq(designs.id, designId), eq(designs.shopId, actor.shopId)) })
  if (!design) return { ok: false, reason: 'not-found' }
  const file = await db.query.attachments.findFirst({ columns: { id: true, kind: true, designId: true }, where: and(eq(attachments.id, input.attachmentId), eq(attachments.shopId, actor.shopId)) })
  if (!file || file.designId !== designId || file.kind !== 'image') return { ok: false, reason: 'bad-attachment' }
  const values = { ...input, updatedBy: actor.userId, updatedAt: new Date() }
  await db.insert(designReferences).values({ designId, ...values })
    .onConflictDoUpdate({ target: designReferences.designId, set: values })
  const reference = await getReference(db, actor.shopId, designId)
  if (!reference) throw new Error('reference vanished after saving')
  return { ok: true, reference }
}

export async function clearReference(db: Database, shopId: string, designId: string): Promise<boolean> {
  const design = await db.query.designs.findFirst({ columns: { id: true }, where: and(eq(designs.id, designId), eq(designs.shopId, shopId)) })
  if (!design) return false
  await db.delete(designReferences).where(eq(designReferences.designId, designId))
  return true
}
