import { readdir, readFile } from 'node:fs/promises'
import { join } from 'node:path'
import { simpleParser, type AddressObject } from 'mailparser'

export interface CaughtMail {
  file: string
  date: string | null
  to: string
  subject: string
  text: string
  html: string | null
  links: string[]
}

const addresses = (a: AddressObject | AddressObject[] | undefined) => (Array.isArray(a) ? a : a ? [a] : []).map(x => x.text).join(', ')

/** The newest messages in the fake's folder that were sent for the shop (by their X-Rootplate-Shop header). */
export async function listFakeMail(dir: string, shopId: string, limit = 50): Promise<CaughtMail[]> {
  let files: string[]
  try {
    files = (await readdir(dir)).filter(f => f.endsWith('.eml')).sort().reverse()
  }
  catch (err: unknown) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return []
    throw err
  }
  const out: CaughtMail[] = []
  for (const file of files) {
    if (out.length >= limit) break
    const parsed = await simpleParser(await readFile(join(dir, file)))
    if (parsed.headers.get('x-rootplate-shop') !== shopId) continue
    const text = parsed.text ?? ''
    out.push({
      file,
      date: parsed.date?.toISOString() ?? null,
      to: addresses(parsed.to),
      subject: parsed.subject ?? '',
      text,
      html: typeof parsed.html === 'string' ? parsed.html : null,
      links: [...new Set(text.match(/https?:\/\/\S+/g) ?? [])],
    })
  }
  return out
}
