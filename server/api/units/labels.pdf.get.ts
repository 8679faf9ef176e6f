import { z } from 'zod'
import { unitFilterSchema } from '../../../shared/utils/unit-schemas'
import { listUnits, type UnitFilter } from '../../services/units'
import { renderLabelSheet } from '../../services/labels'

// Either the listed ids, or every unit the register's filter shows.
const querySchema = unitFilterSchema.extend({
  ids: z.string().optional().transform(s => (s ? s.split(',').filter(Boolean) : undefined))
    .pipe(z.array(z.uuid({ error: 'Unknown unit' })).max(200, 'Print at most 200 labels at once').optional()),
})

/** A printable sheet of labels with a QR code each, opening the unit's page. */
export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'unit:view')
  const { ids, ...filter } = queryWith(event, querySchema)
  const all = await listUnits(useDb(), member.shopId, filter as UnitFilter)
  const chosen = ids ? all.filter(u => ids.includes(u.id)) : all
  const pdf = await renderLabelSheet(chosen.map(u => ({
    id: u.id, label: u.label, kind: u.kind, status: u.status, designName: u.designName, revisionNumber: u.revisionNumber, sizeLabel: u.sizeLabel,
  })), { origin: appOrigin(), font: await templateFont() })
  return sendFile(event, pdf, 'application/pdf', 'unit-labels.pdf')
})
