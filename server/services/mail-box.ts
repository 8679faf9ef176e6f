import { open, readdir, readFile } from 'node:fs/promises'
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

export const MAIL_PAGE_SIZE = 20

const addresses = (a: AddressObject | AddressObject[] | undefined) => (Array.isArray(a) ? a : a ? [a] : []).map(x => x.text).join(', ')

/** The header block of a message file (up to 16 kB), read without the body. */
async function headerBlock(path: string): Promise<string> {
  const handle = await open(path, 'r')
  try {
    const buf = Buffer.alloc(16 * 1024)
    const { bytesRead } = await handle.read(buf, 0, buf.length, 0)
    const text = buf.subarray(0, bytesRead).toString('latin1')
    const end = text.search(/\r?\n\r?\n/)
    return end < 0 ? text : text.slice(0, end)
  }
  finally {
    await handle.close()
  }
}

/** A header's value from a raw header block (folded lines joined), or undefined. */
export function headerValue(block: string, name: string): string | undefined {
  const unfolded = block.replace(/\r?\n[ \t]+/g, ' ')
  const line = unfolded.split(/\r?\n/).find(l => l.toLowerCase().startsWith(`${name.toLowerCase()}:`))
  return line?.slice(name.length + 1).trim()
}

/**
 * One page of the messages in the fake's folder that this member sent for
 * this shop (their X-Rootplate-Shop and X-Rootplate-Sender headers), newest
 * first. Messages without a sender (password resets) are listed to no one:
 * their link is a secret of the recipient alone. Only the headers are read
 * to choose; only the page's messages are parsed.
 */
export async function listFakeMail(dir: string, viewer: { shopId: string; userId: string }, page = 1, pageSize = MAIL_PAGE_SIZE): Promise<{ messages: CaughtMail[]; more: boolean }> {
  let files: string[]
  try {
    files = (await readdir(dir)).filter(f => f.endsWith('.eml')).sort().reverse()
  }
  catch (err: unknown) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return { messages: [], more: false }
    throw err
  }
  const skip = (page - 1) * pageSize
  const chosen: string[] = []
  let matched = 0
  let more = false
  for (const file of files) {
    const block = await headerBlock(join(dir, file)).catch(() => '')
    if (headerValue(block, 'x-rootplate-shop') !== viewer.shopId || headerValue(block, 'x-rootplate-sender') !== viewer.userId) continue
    matched += 1
    if (matched <= skip) continue
    if (chosen.length >= pageSize) {
      more = true
      break
    }
    chosen.push(file)
  }
  const messages: CaughtMail[] = []
  for (const file of chosen) {
    const parsed = await simpleParser(await readFile(join(dir, file)))
    const text = parsed.text ?? ''
    messages.push({
      file,
      date: parsed.date?.toISOString() ?? null,
      to: addresses(parsed.to),
      subject: parsed.subject ?? '',
      text,
      html: typeof parsed.html === 'string' ? parsed.html : null,
      links: [...new Set(text.match(/https?:\/\/\S+/g) ?? [])],
    })
  }
  return { messages, more }
}
