// What each role may do. Used by the server guards (the authority) and by the
// pages (to leave out buttons a role may not use).
export const roles = ['lead', 'designer', 'builder', 'viewer'] as const
export type ShopRole = (typeof roles)[number]

export type ShopAction = 'design:edit' | 'design:create' | 'shop:members' | 'design:view' | 'design:share' | 'shop:activity'

const allowed: Record<ShopAction, readonly ShopRole[]> = {
  'design:view': roles,
  'design:create': ['lead', 'designer'],
  'design:edit': ['lead', 'designer'],
  'shop:members': ['lead'],
  'design:share': ['lead', 'designer'],
  'shop:activity': ['lead'],
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
