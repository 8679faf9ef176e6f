import type { H3Event } from 'h3'
import { plateFromRevision } from '../services/exports'
import { openShare, type OpenShare } from '../services/shares'
import type { Plate } from '../../geometry'

/**
 * The share named by the route's token and its rebuilt plate: 404 when unknown
 * or withdrawn, 410 once expired. It reaches one revision and nothing else.
 */
export async function sharedRevision(event: H3Event): Promise<{ share: OpenShare; plate: Plate }> {
  const share = await sharedOnly(event)
  const built = plateFromRevision(share.revision)
  if (!built.ok) throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message: 'The shop needs to save this design again before its files can be made' })
  return { share, plate: built.plate }
}

export async function sharedOnly(event: H3Event): Promise<OpenShare> {
  const token = getRouterParam(event, 'token')
  const found = linkToken.safeParse(token).success ? await openShare(useDb(), token as string) : { state: 'missing' as const }
  if (found.state === 'expired') throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This link has expired. Ask the shop that sent it for a new one.' })
  if (found.state !== 'open') throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This link is not known or was withdrawn by the shop.' })
  return found.share
}
