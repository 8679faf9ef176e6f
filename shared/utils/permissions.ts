// What each role may do. Used by the server guards (the authority) and by the
// pages (to leave out buttons a role may not use).
export const roles = ['lead', 'designer', 'builder', 'viewer'] as const
export type ShopRole = (typeof roles)[number]

export type ShopAction = 'design:edit' | 'design:create' | 'shop:members' | 'design:view' | 'design:share' | 'shop:activity'
  | 'attachment:add' | 'unit:view' | 'unit:edit' | 'revision:comment' | 'show:manage'

const allowed: Record<ShopAction, readonly ShopRole[]> = {
  'design:view': roles,
  'design:create': ['lead', 'designer'],
  'design:edit': ['lead', 'designer'],
  'shop:members': ['lead'],
  // Reference images and drawings on a design: the people who shape it.
  'attachment:add': ['lead', 'designer'],
  'unit:view': roles,
  // Builders record what they built: new units, stages, loans, photos.
  'unit:edit': ['lead', 'designer', 'builder'],
  'design:share': ['lead', 'designer'],
  'shop:activity': ['lead'],
  // A note on a revision: anyone in the shop, builders and viewers included.
  'revision:comment': roles,
  // Shows are planned by the people who make the designs for them.
  'show:manage': ['lead', 'designer'],
}

export function can(role: ShopRole | undefined | null, action: ShopAction): boolean {
  return !!role && allowed[action].includes(role)
}

export const roleLabels: Record<ShopRole, string> = {
  lead: 'Shop lead',
  designer: 'Designer',
  builder: 'Builder',
  viewer: 'Viewer',
}
