// Public: the share page's content. Only the one revision's labels and the shop's note.
export default defineEventHandler(async (event) => {
  const share = await sharedOnly(event)
  return {
    shopName: share.shopName,
    designName: share.revision.designName,
    sizeLabel: share.revision.sizeLabel,
    revision: share.revision.number,
    savedAt: share.revision.createdAt,
    note: share.note,
    expiresAt: share.expiresAt,
  }
})
