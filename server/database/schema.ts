import { sql } from 'drizzle-orm'
import {
  pgTable, pgEnum, uuid, text, integer, bigint, doublePrecision, jsonb, timestamp, date, index, uniqueIndex, check,
  type AnyPgColumn,
} from 'drizzle-orm/pg-core'

export const roleEnum = pgEnum('member_role', ['lead', 'designer', 'builder', 'viewer'])

// Shared columns, defined once.
const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
const timestamps = {
  createdAt: createdAt(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow().$onUpdate(() => new Date()),
}
const id = () => uuid('id').primaryKey().defaultRandom()

export const users = pgTable('users', {
  id: id(),
  email: text('email').notNull(),
  name: text('name').notNull(),
  passwordHash: text('password_hash').notNull(),
  // Display units, last export settings: validated by shared/utils/preferences.ts.
  preferences: jsonb('preferences').notNull().default({}),
  ...timestamps,
}, t => [
  uniqueIndex('users_email_key').on(sql`lower(${t.email})`),
])

export const shops = pgTable('shops', {
  id: id(),
  name: text('name').notNull(),
  ...timestamps,
})

export const memberships = pgTable('memberships', {
  id: id(),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  role: roleEnum('role').notNull(),
  ...timestamps,
}, t => [
  uniqueIndex('memberships_user_shop_key').on(t.userId, t.shopId),
  index('memberships_shop_idx').on(t.shopId),
])

export const shows = pgTable('shows', {
  id: id(),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  venue: text('venue'),
  opensOn: date('opens_on'),
  // Archived shows drop out of the lists but keep their designs and history.
  archivedAt: timestamp('archived_at', { withTimezone: true }),
  ...timestamps,
}, t => [
  index('shows_shop_idx').on(t.shopId),
])

export const designs = pgTable('designs', {
  id: id(),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  showId: uuid('show_id').references(() => shows.id, { onDelete: 'set null' }),
  name: text('name').notNull(),
  sizeLabel: text('size_label'),
  // Number of the newest revision; the guarded update on this column is what
  // serialises racing saves (see services/designs.ts).
  latestRevision: integer('latest_revision').notNull().default(0),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  // How many of this plate its show needs.
  quantity: integer('quantity').notNull().default(1),
  // Archived designs leave the lists; they are never deleted with their history.
  archivedAt: timestamp('archived_at', { withTimezone: true }),
  // A size of a family: the design it was derived from, and which revision of
  // it this size last followed (what "behind" is measured against). Both null
  // for a design of its own, and again once a size is detached.
  parentDesignId: uuid('parent_design_id').references((): AnyPgColumn => designs.id, { onDelete: 'set null' }),
  parentRevisionId: uuid('parent_revision_id').references((): AnyPgColumn => revisions.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('designs_shop_idx').on(t.shopId),
  index('designs_show_idx').on(t.showId),
  index('designs_parent_idx').on(t.parentDesignId),
  check('designs_quantity_range', sql`${t.quantity} between 0 and 999`),
])

// Immutable: no updated_at, and a trigger in the migrations refuses updates.
export const revisions = pgTable('revisions', {
  id: id(),
  designId: uuid('design_id').notNull().references(() => designs.id, { onDelete: 'cascade' }),
  number: integer('number').notNull(),
  params: jsonb('params').notNull(),
  note: text('note').notNull().default(''),
  authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('revisions_design_number_key').on(t.designId, t.number),
  check('revisions_number_positive', sql`${t.number} > 0`),
])

export const activity = pgTable('activity', {
  id: id(),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  userId: uuid('user_id').references(() => users.id, { onDelete: 'set null' }),
  designId: uuid('design_id').references(() => designs.id, { onDelete: 'cascade' }),
  action: text('action').notNull(),
  detail: jsonb('detail').notNull().default({}),
  createdAt: createdAt(),
}, t => [
  index('activity_shop_time_idx').on(t.shopId, t.createdAt),
])


// Sign-in limits: one row per bucket ('account:<e-mail>' or 'address:<ip>'),
// claimed under a row lock before a password is checked, so parallel tries
// cannot slip past the count (server/services/sign-in-limits.ts).
export const signInLimits = pgTable('sign_in_limits', {
  key: text('key').primaryKey(),
  /** Failed (or still running) tries since the bucket was last quiet for the whole window. */
  failures: integer('failures').notNull().default(0),
  /** Past the free tries, the earliest moment the next try is checked. */
  nextAt: timestamp('next_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('sign_in_limits_updated_idx').on(t.updatedAt),
  check('sign_in_limits_failures_nonnegative', sql`${t.failures} >= 0`),
])

// Counted limits on what a person may make the server do in a window (mail
// to one recipient, mail by one member, comments, share downloads): one row
// per key, raised by one atomic INSERT ... ON CONFLICT DO UPDATE, so parallel
// requests cannot pass the cap (server/services/rate-limits.ts).
export const rateLimits = pgTable('rate_limits', {
  key: text('key').primaryKey(),
  count: integer('count').notNull().default(0),
  /** When the current window ends and the count starts again from zero. */
  windowEnd: timestamp('window_end', { withTimezone: true }).notNull(),
}, t => [
  index('rate_limits_window_end_idx').on(t.windowEnd),
  check('rate_limits_count_nonnegative', sql`${t.count} >= 0`),
])

// --- Uploads and the register of built units and patterns ---

export const attachmentKindEnum = pgEnum('attachment_kind', ['image', 'pdf'])

// The bytes live in Nitro's storage ('uploads' mount: disk or S3); this row is
// what we know about them. A file belongs to a design or to a unit, never both.
export const attachments = pgTable('attachments', {
  id: id(),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  designId: uuid('design_id').references(() => designs.id, { onDelete: 'cascade' }),
  unitId: uuid('unit_id').references(() => units.id, { onDelete: 'cascade' }),
  kind: attachmentKindEnum('kind').notNull(),
  contentType: text('content_type').notNull(),
  name: text('name').notNull(),
  size: bigint('size', { mode: 'number' }).notNull(),
  storageKey: text('storage_key').notNull(),
  uploadedBy: uuid('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
}, t => [
  index('attachments_design_idx').on(t.designId),
  index('attachments_unit_idx').on(t.unitId),
  index('attachments_shop_idx').on(t.shopId),
  check('attachments_one_owner', sql`(${t.designId} is null) <> (${t.unitId} is null)`),
])

// Where the reference image sits under the plate. Kept with the design, not a
// revision: it is a drawing aid, never part of what gets built or exported.
export const designReferences = pgTable('design_references', {
  designId: uuid('design_id').primaryKey().references(() => designs.id, { onDelete: 'cascade' }),
  attachmentId: uuid('attachment_id').notNull().references(() => attachments.id, { onDelete: 'cascade' }),
  // Plate coordinates (mm, y up) of the image centre, its turn (degrees, counter-clockwise) and scale.
  x: doublePrecision('x').notNull().default(0),
  y: doublePrecision('y').notNull().default(0),
  rotation: doublePrecision('rotation').notNull().default(0),
  mmPerPixel: doublePrecision('mm_per_pixel').notNull().default(1),
  opacity: doublePrecision('opacity').notNull().default(0.5),
  updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
}, t => [
  index('design_references_attachment_idx').on(t.attachmentId),
  check('design_references_scale_positive', sql`${t.mmPerPixel} > 0`),
  check('design_references_opacity_range', sql`${t.opacity} >= 0 and ${t.opacity} <= 1`),
])

export const unitKindEnum = pgEnum('unit_kind', ['plate', 'pattern'])
export const unitStatusEnum = pgEnum('unit_status', ['cut', 'laminated', 'hardware_fitted', 'finished', 'in_stock', 'on_loan', 'retired'])

export const units = pgTable('units', {
  id: id(),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  kind: unitKindEnum('kind').notNull(),
  label: text('label').notNull(),
  designId: uuid('design_id').references(() => designs.id, { onDelete: 'set null' }),
  revisionId: uuid('revision_id').references(() => revisions.id, { onDelete: 'set null' }),
  sizeLabel: text('size_label'),
  status: unitStatusEnum('status').notNull().default('cut'),
  location: text('location').notNull().default(''),
  notes: text('notes').notNull().default(''),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [
  index('units_shop_idx').on(t.shopId),
  index('units_design_idx').on(t.designId),
  index('units_revision_idx').on(t.revisionId),
  uniqueIndex('units_shop_label_key').on(t.shopId, sql`lower(${t.label})`),
])

// Who changed what and when: one row per change, with each field's before and after.
export const unitEvents = pgTable('unit_events', {
  id: id(),
  unitId: uuid('unit_id').notNull().references(() => units.id, { onDelete: 'cascade' }),
  userId: uuid('user_id').references(() => users.id, { onDelete: 'set null' }),
  action: text('action').notNull(),
  changes: jsonb('changes').notNull().default({}),
  createdAt: createdAt(),
}, t => [
  index('unit_events_unit_time_idx').on(t.unitId, t.createdAt),
])

export const unitLoans = pgTable('unit_loans', {
  id: id(),
  unitId: uuid('unit_id').notNull().references(() => units.id, { onDelete: 'cascade' }),
  borrower: text('borrower').notNull(),
  outOn: date('out_on').notNull(),
  dueOn: date('due_on').notNull(),
  returnedOn: date('returned_on'),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
}, t => [
  index('unit_loans_unit_idx').on(t.unitId),
  // At most one open loan per unit.
  uniqueIndex('unit_loans_open_key').on(t.unitId).where(sql`${t.returnedOn} is null`),
  check('unit_loans_due_after_out', sql`${t.dueOn} >= ${t.outOn}`),
])

export type User = typeof users.$inferSelect
export type Shop = typeof shops.$inferSelect
export type Membership = typeof memberships.$inferSelect
export type Show = typeof shows.$inferSelect
export type Design = typeof designs.$inferSelect
export type Revision = typeof revisions.$inferSelect
export type Activity = typeof activity.$inferSelect
export type Role = (typeof roleEnum.enumValues)[number]
export type Attachment = typeof attachments.$inferSelect
export type DesignReference = typeof designReferences.$inferSelect
export type Unit = typeof units.$inferSelect
export type UnitEvent = typeof unitEvents.$inferSelect
export type UnitLoan = typeof unitLoans.$inferSelect

// Server-side sessions. The cookie holds only a random token; its SHA-256 is
// the id here, so a leaked table cannot be replayed as cookies. The role is
// never stored with the session: it is joined from memberships each request.
export const sessions = pgTable('sessions', {
  id: text('id').primaryKey(),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  createdAt: createdAt(),
  lastSeenAt: timestamp('last_seen_at', { withTimezone: true }).notNull().defaultNow(),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  idleTimeoutMinutes: integer('idle_timeout_minutes').notNull(),
}, t => [
  index('sessions_user_idx').on(t.userId),
  check('sessions_idle_positive', sql`${t.idleTimeoutMinutes} > 0`),
])

// Invitations to join a shop. Only the token's SHA-256 is kept.
export const invitations = pgTable('invitations', {
  id: id(),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  email: text('email').notNull(),
  role: roleEnum('role').notNull(),
  tokenHash: text('token_hash').notNull(),
  invitedBy: uuid('invited_by').references(() => users.id, { onDelete: 'set null' }),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  acceptedAt: timestamp('accepted_at', { withTimezone: true }),
  withdrawnAt: timestamp('withdrawn_at', { withTimezone: true }),
  ...timestamps,
}, t => [
  uniqueIndex('invitations_token_hash_key').on(t.tokenHash),
  index('invitations_shop_idx').on(t.shopId),
])

// Password-reset links: single use, one hour, only the token's hash kept.
export const passwordResets = pgTable('password_resets', {
  id: id(),
  userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull(),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  usedAt: timestamp('used_at', { withTimezone: true }),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('password_resets_token_hash_key').on(t.tokenHash),
  index('password_resets_user_idx').on(t.userId),
])

// Read-only links to one revision's files for an outside shop.
export const shares = pgTable('shares', {
  id: id(),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull(),
  note: text('note').notNull().default(''),
  createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  withdrawnAt: timestamp('withdrawn_at', { withTimezone: true }),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('shares_token_hash_key').on(t.tokenHash),
  index('shares_shop_idx').on(t.shopId),
  index('shares_revision_idx').on(t.revisionId),
])

export type Session = typeof sessions.$inferSelect
export type Invitation = typeof invitations.$inferSelect
export type Share = typeof shares.$inferSelect

// Notes any member of the shop leaves on one revision (a builder to the
// designer, a lead to the crew). The revision itself never changes; its
// comments are rows of their own. shop_id keeps every query scoped by shop.
export const revisionComments = pgTable('revision_comments', {
  id: id(),
  shopId: uuid('shop_id').notNull().references(() => shops.id, { onDelete: 'cascade' }),
  revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
  authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
  body: text('body').notNull(),
  createdAt: createdAt(),
}, t => [
  index('revision_comments_revision_time_idx').on(t.revisionId, t.createdAt),
  index('revision_comments_shop_idx').on(t.shopId),
  check('revision_comments_body_length', sql`char_length(${t.body}) between 1 and 2000`),
])
export type RevisionComment = typeof revisionComments.$inferSelect
