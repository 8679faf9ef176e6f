import { sql } from 'drizzle-orm'
import {
  pgTable, pgEnum, uuid, text, integer, jsonb, timestamp, date, index, uniqueIndex, check,
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
  ...timestamps,
}, t => [
  index('designs_shop_idx').on(t.shopId),
  index('designs_show_idx').on(t.showId),
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

// Failed sign-ins, kept so the limit holds across server instances.
export const loginFailures = pgTable('login_failures', {
  id: id(),
  email: text('email').notNull(),
  address: text('address').notNull(),
  createdAt: createdAt(),
}, t => [
  index('login_failures_email_time_idx').on(t.email, t.createdAt),
  index('login_failures_address_time_idx').on(t.address, t.createdAt),
])

export type User = typeof users.$inferSelect
export type Shop = typeof shops.$inferSelect
export type Membership = typeof memberships.$inferSelect
export type Show = typeof shows.$inferSelect
export type Design = typeof designs.$inferSelect
export type Revision = typeof revisions.$inferSelect
export type Activity = typeof activity.$inferSelect
export type Role = (typeof roleEnum.enumValues)[number]

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
