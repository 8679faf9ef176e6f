import { readdir, readFile } from 'node:fs/promises'
import { join } from 'node:path'
import { inject } from 'vitest'
import { simpleParser, type ParsedMail } from 'mailparser'

export interface Caught { file: string; mail: ParsedMail; text: string; html: string; link: string }

/**
 * Waits for the message to `to` whose subject matches, in the test run's mail
 * fake folder, parsed with mailparser (independent of the app's own code).
 * `seen` lists files to skip (older messages to the same address).
 */
export async function waitForMail(to: string, subject: RegExp, seen: string[] = [], timeoutMs = 15_000): Promise<Caught> {
  const dir = inject('mailDir')
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const files = (await readdir(dir).catch(() => [] as string[])).filter(f => f.endsWith('.eml') && !seen.includes(f)).sort()
    for (const file of files) {
      const mail = await simpleParser(await readFile(join(dir, file)))
      const addressed = (Array.isArray(mail.to) ? mail.to : mail.to ? [mail.to] : []).some(a => a.value.some(v => v.address?.toLowerCase() === to.toLowerCase()))
      if (addressed && subject.test(mail.subject ?? '')) {
        const text = mail.text ?? ''
        const link = text.match(/https?:\/\/\S+/)?.[0] ?? ''
        return { file, mail, text, html: typeof mail.html === 'string' ? mail.html : '', link }
      }
    }
    await new Promise(r => setTimeout(r, 100))
  }
  throw new Error(`no message to ${to} matching ${subject} within ${timeoutMs} ms`)
}

/** Every message file to the address so far, to skip in a later wait. */
export async function mailFilesTo(to: string): Promise<string[]> {
  const dir = inject('mailDir')
  const out: string[] = []
  for (const file of (await readdir(dir).catch(() => [] as string[])).filter(f => f.endsWith('.eml'))) {
    const mail = await simpleParser(await readFile(join(dir, file)))
    const list = Array.isArray(mail.to) ? mail.to : mail.to ? [mail.to] : []
    if (list.some(a => a.value.some(v => v.address?.toLowerCase() === to.toLowerCase()))) out.push(file)
  }
  return out
}
