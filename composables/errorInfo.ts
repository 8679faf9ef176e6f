/** The message and field messages of a failed `$fetch`, for forms and alerts. */
export function errorInfo(err: unknown): { status: number | undefined; message: string; fields: Record<string, string>; data: unknown } {
  if (err && typeof err === 'object') {
    const e = err as { statusCode?: number; status?: number; data?: { message?: string; data?: { fields?: Record<string, string> } }; message?: string }
    const status = e.statusCode ?? e.status
    const message = e.data?.message ?? (status ? `The server answered ${status}` : e.message) ?? 'Something went wrong'
    return { status, message, fields: e.data?.data?.fields ?? {}, data: e.data?.data }
  }
  return { status: undefined, message: 'Something went wrong', fields: {}, data: undefined }
}
