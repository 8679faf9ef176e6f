import { z } from 'zod'
import { unitFilterSchema } from '../../../shared/utils/unit-schemas'
import { listUnits, type UnitFilter } from '../../services/units'
import { MAX_LABELS_PER_SHEET, refuseTooManyLabels } from '../../services/labels'

// Either the listed ids, or every unit the register's filter shows (at most MAX_LABELS_PER_SHEET either way).
const querySchema = unitFilterSchema.extend({
  ids: z.string().optional().transform(s => (s ? s.split(',').filter(Boolean) : undefined))
    .pipe(z.array(z.uuid({ error: 'Unknown unit' })).max(MAX_LABELS_PER_SHEET, `Print at most ${MAX_LABELS_PER_SHEET} labels at once`).optional()),
})

/** A printable sheet of labels with a QR code each, opening the unit's page; drawn on the worker pool. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:view')
  const { ids, ...filter } = queryWith(event, querySchema)
  const all = await listUnits(useDb(), member.shopId, filter as UnitFilter)
  const chosen = ids ? all.filter(u => ids.includes(u.id)) : all
  refuseTooManyLabels(chosen.length)
  const items = chosen.map(u => ({ id: u.id, label: u.label, kind: u.kind, status: u.status, designName: u.designName, revisionNumber: u.revisionNumber, sizeLabel: u.sizeLabel }))
  const { body } = await runCostly(event, { kind: 'labels', items, origin: appOrigin(), font: await templateFont() }, memberOwner(member))
  return sendFile(event, body, 'application/pdf', 'unit-labels.pdf')
})
