import type { H3Event } from 'h3'
import { fileTypeFromBuffer } from 'file-type'
import { readBodyWithin } from './request-limits'

/** The largest file a shop may upload. */
export const UPLOAD_LIMIT = 15 * 1024 * 1024
// Room for the multipart boundaries and part headers around the file.
const ENVELOPE = 64 * 1024

export const acceptedTypes = {
  'image/png': 'image',
  'image/jpeg': 'image',
  'image/webp': 'image',
  'application/pdf': 'pdf',
} as const
export type AcceptedType = keyof typeof acceptedTypes

/** Bidirectional controls (embeddings, overrides, isolates, marks): they make "gpj.exe" read as "exe.jpg". */
const BIDI_CONTROLS = /[\u061C\u200E\u200F\u202A-\u202E\u2066-\u2069]/g
const LONE_SURROGATES = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g
export const MAX_NAME_CHARS = 200

/** The text with every lone UTF-16 half made U+FFFD. */
export const wellFormed = (s: string) => s.replace(LONE_SURROGATES, '\uFFFD')

/**
 * The name kept for an upload: path separators and control characters become
 * "_", bidirectional controls are dropped, a lone UTF-16 half becomes U+FFFD,
 * and the name is cut to 200 characters, never inside a character (a cut
 * through a surrogate pair would leave half a symbol that no header can carry).
 */
export function storedFileName(raw: string | undefined): string {
  const cleaned = wellFormed(raw || 'upload').replace(BIDI_CONTROLS, '').replace(/[\\/\u0000-\u001f\u007f]/g, '_')
  const cut = Array.from(cleaned).slice(0, MAX_NAME_CHARS).join('')
  return cut || 'upload'
}

export interface UploadedFile { name: string; bytes: Uint8Array; contentType: AcceptedType; kind: 'image' | 'pdf' }

function tooLarge(): Error {
  return createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: `Files may be at most ${UPLOAD_LIMIT / 1024 / 1024} MB`, data: { fields: { file: `Files may be at most ${UPLOAD_LIMIT / 1024 / 1024} MB` } } })
}

/** The request body within the limit; a body announced larger is refused before any of it is read. */
async function readLimited(event: H3Event, limit: number): Promise<Buffer> {
  const announced = Number(getRequestHeader(event, 'content-length') ?? 'NaN')
  if (Number.isFinite(announced) && announced > limit) throw tooLarge()
  return readBodyWithin(event, limit, tooLarge)
}

/**
 * The one file of a multipart form (field `file`), its type read from its
 * first bytes (never from its name or the sender's word): PNG, JPEG, WebP or
 * PDF, else 415; over the limit, 413.
 */
export async function readUpload(event: H3Event): Promise<UploadedFile> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!/^multipart\/form-data;/i.test(type)) {
    throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: 'Send the file as multipart/form-data in a field named “file”' })
  }
  const body = await readLimited(event, UPLOAD_LIMIT + ENVELOPE)
  let form: FormData
  try {
    form = await new Response(new Uint8Array(body.buffer, body.byteOffset, body.byteLength) as Uint8Array<ArrayBuffer>, { headers: { 'content-type': type } }).formData()
  }
  catch {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The upload could not be read as a multipart form' })
  }
  const file = form.get('file')
  if (!file || typeof file === 'string') invalid({ file: 'Choose a file to upload' })
  if (file.size === 0) invalid({ file: 'The file is empty' })
  if (file.size > UPLOAD_LIMIT) throw tooLarge()
  const bytes = new Uint8Array(await file.arrayBuffer())
  const found = await fileTypeFromBuffer(bytes)
  if (!found || !(found.mime in acceptedTypes)) {
    throw createError({
      statusCode: 415,
      statusMessage: 'Unsupported Media Type',
      message: `This file is ${found ? `a ${found.ext.toUpperCase()} file` : 'not a type we recognise'}: upload a PNG, JPEG or WebP image, or a PDF`,
      data: { fields: { file: 'Upload a PNG, JPEG or WebP image, or a PDF' } },
    })
  }
  const contentType = found.mime as AcceptedType
  const name = storedFileName(file.name)
  return { name, bytes, contentType, kind: acceptedTypes[contentType] }
}
