import { getShow } from '../../services/shows'

export default defineEventHandler(async (event) => {
  const member = await requireAction(event, 'design:view')
  const id = routeId(event)
  // Plates not built before are built on the worker pool, within the member's limit of costly work.
  const found = await getShow(useDb(), member.shopId, id, async (revisions) => {
    const { body } = await runCostly(event, { kind: 'plate-figures', revisions }, memberOwner(member))
    return JSON.parse(body as string)
  })
  if (!found) throw notFound('That show')
  // How many plates this answer built (0 once every revision's figures are kept).
  setResponseHeader(event, 'x-rootplate-plates-built', found.built)
  return found.show
})
