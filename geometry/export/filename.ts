// File names for downloads: readable, safe on every file system and in a
// Content-Disposition header (ASCII letters, digits and hyphens only).

export interface ExportFileMeta {
  designName: string
  /** e.g. `18in` or `Large`. */
  sizeLabel?: string
  revision: number
}

/** Letters that do not decompose into a base letter and an accent. */
const SPELLED: Record<string, string> = { ß: 'ss', æ: 'ae', œ: 'oe', ø: 'o', đ: 'd', ł: 'l', þ: 'th' }

export function slugify(text: string): string {
  return text
    .toLowerCase()
    .replace(/[ßæœøđłþ]/g, (c) => SPELLED[c] ?? '')
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
}

/** `exportFileName({ designName: 'Oak trunk', sizeLabel: '18 in', revision: 3 }, 'dxf')` is `oak-trunk-18in-r3.dxf`. */
export function exportFileName(meta: ExportFileMeta, ext: string): string {
  const name = slugify(meta.designName) || 'plate'
  // "18 in" reads as one size, so its spaces go rather than becoming hyphens.
  const size = meta.sizeLabel ? slugify(meta.sizeLabel.replace(/(\d)\s+(?=[a-z])/gi, '$1')) : ''
  const revision = Number.isInteger(meta.revision) && meta.revision >= 0 ? `r${meta.revision}` : ''
  const extension = ext.replace(/^\.+/, '').toLowerCase().replace(/[^a-z0-9]/g, '')
  const base = [name, size, revision].filter((p) => p !== '').join('-')
  return extension ? `${base}.${extension}` : base
}
