import type { AttachmentView } from '~~/server/services/uploads'

export type AttachmentRow = Omit<AttachmentView, 'createdAt'> & { createdAt: string }
export interface ReferencePlacement { attachmentId: string; x: number; y: number; rotation: number; mmPerPixel: number; opacity: number }
export type ReferenceRow = ReferencePlacement & { url: string; updatedAt: string }

/** Same figure as the server's limit; checked here too so a large file is refused before it is sent. */
export const UPLOAD_LIMIT_BYTES = 15 * 1024 * 1024
export const UPLOAD_ACCEPT = 'image/png,image/jpeg,image/webp,application/pdf'

export function useAttachments(designId: MaybeRefOrGetter<string>) {
  return useFetch<AttachmentRow[]>(() => `/api/designs/${toValue(designId)}/attachments`, { key: `attachments:${toValue(designId)}`, default: () => [] })
}

export function useReference(designId: MaybeRefOrGetter<string>) {
  return useFetch<ReferenceRow | null>(() => `/api/designs/${toValue(designId)}/reference`, { key: `reference:${toValue(designId)}`, default: () => null })
}

/** Sends one file as the multipart form the server reads (field `file`). */
export async function uploadFile(url: string, file: File): Promise<AttachmentRow> {
  if (file.size > UPLOAD_LIMIT_BYTES) {
    throw Object.assign(new Error('too large'), { statusCode: 413, data: { message: `“${file.name}” is ${(file.size / 1024 / 1024).toFixed(1)} MB; files may be at most 15 MB` } })
  }
  const form = new FormData()
  form.append('file', file, file.name)
  return await $fetch<AttachmentRow>(url, { method: 'POST', body: form })
}

export function formatBytes(n: number): string {
  if (n < 1024) return `${n} B`
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(0)} KB`
  return `${(n / 1024 / 1024).toFixed(1)} MB`
}
