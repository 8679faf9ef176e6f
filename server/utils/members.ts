export function memberChangeError(reason: 'not-found' | 'last-lead'): Error {
  if (reason === 'not-found') return notFound('That member')
  return createError({ statusCode: 409, statusMessage: 'Conflict', message: 'A shop needs at least one lead: make someone else a lead first' })
}
