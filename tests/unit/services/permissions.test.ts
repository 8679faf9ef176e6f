import { describe, expect, it } from 'vitest'
import { can, roles } from '../../../shared/utils/permissions'

// The role table of the product brief: designers shape and save, builders and
// viewers read, the lead runs the shop.
describe('what each role may do', () => {
  it('lets every role view designs, and nobody without a role', () => {
    for (const r of roles) expect(can(r, 'design:view')).toBe(true)
    expect(can(undefined, 'design:view')).toBe(false)
    expect(can(null, 'design:view')).toBe(false)
  })
  it('lets only leads and designers create and save', () => {
    expect(roles.filter(r => can(r, 'design:create'))).toEqual(['lead', 'designer'])
    expect(roles.filter(r => can(r, 'design:edit'))).toEqual(['lead', 'designer'])
  })
  it('lets only the lead see the crew', () => {
    expect(roles.filter(r => can(r, 'shop:members'))).toEqual(['lead'])
  })
  // The product brief: builders "mark units as built"; designers and the lead shape the design and its sketches.
  it('lets leads and designers attach files to a design, and builders too record units', () => {
    expect(roles.filter(r => can(r, 'attachment:add'))).toEqual(['lead', 'designer'])
    expect(roles.filter(r => can(r, 'unit:edit'))).toEqual(['lead', 'designer', 'builder'])
    expect(roles.filter(r => can(r, 'unit:view'))).toEqual([...roles])
  })
})
