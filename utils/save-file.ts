// Handing downloaded bytes to the browser, for every download button.

/** The file name a Content-Disposition header gives (RFC 6266, with its UTF-8 form), or null. */
export function fileNameFrom(disposition: string | null): string | null {
  if (!disposition) return null
  const extended = /filename\*\s*=\s*UTF-8''([^;]+)/i.exec(disposition)
  if (extended?.[1]) return decodeURIComponent(extended[1])
  return /filename\s*=\s*"([^"]+)"/i.exec(disposition)?.[1] ?? /filename\s*=\s*([^;\s]+)/i.exec(disposition)?.[1] ?? null
}

/** Saves a blob under a name through a temporary link. */
export function saveBlob(blob: Blob, name: string) {
  const href = URL.createObjectURL(blob)
  const a = document.createElement('a')
  a.href = href
  a.download = name
  document.body.appendChild(a)
  a.click()
  a.remove()
  // The browser reads the blob after the click returns; revoking at once can cancel the download.
  setTimeout(() => URL.revokeObjectURL(href), 30_000)
}
