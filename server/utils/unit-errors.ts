import type { UnitError } from '../services/units'

/** The HTTP answer for each way a change to a unit can be refused. */
export function unitFailure(reason: UnitError['reason']): never {
  switch (reason) {
    case 'not-found': throw notFound('That unit')
    case 'bad-design': invalid({ designId: 'Choose a design of your shop' })
    case 'bad-revision': invalid({ revisionId: 'Choose a revision of that design' })
    case 'label-taken': invalid({ label: 'Another unit or pattern already has this label' })
    case 'before-out': invalid({ returnedOn: 'The return date is before the day it went out' })
    case 'on-loan': throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This unit is out on loan: record its return first' })
    case 'not-lendable': throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'A retired unit cannot be lent' })
    case 'not-on-loan': throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This unit is not out on loan' })
  }
}
