import type { H3Event } from 'h3'
import { getRevision } from '../services/designs'
import { plateFromRevision, type RevisionForExport } from '../services/exports'
import type { Plate } from '../../geometry'
import type { Member } from './auth'

/** The revision named in the route (of the member's shop) and its rebuilt plate, or the right error. */
export async function revisionPlate(event: H3Event, member: Member): Promise<{ revision: RevisionForExport; plate: Plate }> {
  const revision = await getRevision(useDb(), member.shopId, routeId(event))
  if (!revision) throw notFound('That revision')
  const forExport: RevisionForExport = { number: revision.number, params: revision.params, designName: revision.designName, sizeLabel: revision.sizeLabel, createdAt: revision.createdAt }
  const built = plateFromRevision(forExport)
  if (!built.ok) invalid(built.fields, 'This revision was saved with params that no longer pass the checks; open it in the editor and save it again')
  return { revision: forExport, plate: built.plate }
}

/** The template font, shipped with the server as a Nitro server asset. */
export async function templateFont(): Promise<Uint8Array> {
  const raw = await useStorage('assets:fonts').getItemRaw<Buffer | Uint8Array>('ibm-plex-sans-latin-400-normal.woff')
  if (!raw) throw createError({ statusCode: 500, message: 'The template font is missing from the server build' })
  return raw instanceof Uint8Array ? raw : new Uint8Array(raw)
}

export function sendFile(event: H3Event, body: Uint8Array | string, type: string, filename: string) {
  setResponseHeaders(event, {
    'content-type': type,
    'content-disposition': `attachment; filename="${filename}"`,
    'cache-control': 'no-store',
  })
  return body
}
