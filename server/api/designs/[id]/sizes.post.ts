import { z } from 'zod'
import { makeSizes } from '../../../services/families'
import { TUBE_DIAMETER_RANGE } from '../../../../geometry/core'
import { sizeLabel } from '../../../../shared/utils/show-schemas'

const tubeMessage = `Give the measured tube diameter in mm, ${TUBE_DIAMETER_RANGE.min} to ${TUBE_DIAMETER_RANGE.max}`
const bodySchema = z.object({
  sizes: z.array(z.object({
    label: sizeLabel.pipe(z.string().min(1, 'Name the size, e.g. Small')),
    tubeDiameter: z.number({ error: tubeMessage }).min(TUBE_DIAMETER_RANGE.min, tubeMessage).max(TUBE_DIAMETER_RANGE.max, tubeMessage),
  }).strict(), { error: 'Give the sizes to make' }).min(1, 'Give at least one size').max(12, 'At most 12 sizes at once')
    .refine(list => new Set(list.map(s => s.label.toLowerCase())).size === list.length, 'Give each size its own label'),
}).strict()

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:create')
  const id = routeId(event)
  const body = await readBodyWith(event, bodySchema)
  const result = await makeSizes(useDb(), member, id, body.sizes)
  if (!result.ok) {
    if (result.reason === 'not-found') throw notFound('That design')
    invalid({ _: 'The latest revision of this design cannot be read; save it again in the editor first' })
  }
  setResponseStatus(event, 201)
  return result.sizes
})
