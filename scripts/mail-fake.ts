// The project's local SMTP fake: accepts every message on 127.0.0.1 and writes
// it, unchanged, as one .eml file into MAIL_DIR (default .data/mail). `npm start`
// runs it in the background (pid in .data/mail-fake.pid); the e2e set-up starts
// it in-process on a port of its own. Never exposed beyond this machine.
import { mkdirSync, rmSync, writeFileSync } from 'node:fs'
import { randomBytes } from 'node:crypto'
import { join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { SMTPServer } from 'smtp-server'

export interface MailFake { port: number; dir: string; stop: () => Promise<void> }

export function startMailFake(opts: { port: number; dir: string; host?: string }): Promise<MailFake> {
  const dir = resolve(opts.dir)
  mkdirSync(dir, { recursive: true })
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Rootplate local mail fake',
    size: 10 * 1024 * 1024,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (c: Buffer) => chunks.push(c))
      stream.on('error', callback)
      stream.on('end', () => {
        // A sortable name: time first, then randomness so two in one millisecond never clash.
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomBytes(4).toString('hex')}.eml`
        try {
          writeFileSync(join(dir, name), Buffer.concat(chunks))
          callback()
        }
        catch (err: unknown) {
          callback(err instanceof Error ? err : new Error(String(err)))
        }
      })
    },
  })
  return new Promise((resolvePromise, reject) => {
    server.once('error', reject)
    server.listen(opts.port, opts.host ?? '127.0.0.1', () => {
      const addr = server.server.address()
      const port = addr && typeof addr === 'object' ? addr.port : opts.port
      resolvePromise({ port, dir, stop: () => new Promise(r => server.close(() => r())) })
    })
  })
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const port = Number(process.env.SMTP_PORT ?? 2525)
  const dir = process.env.MAIL_DIR ?? '.data/mail'
  const pidFile = process.env.MAIL_FAKE_PID ?? '.data/mail-fake.pid'
  startMailFake({ port, dir }).then((fake) => {
    writeFileSync(pidFile, `${process.pid} ${fake.port}\n`)
    console.log(`mail fake: listening on 127.0.0.1:${fake.port}, writing to ${fake.dir}`)
    const quit = () => fake.stop().finally(() => { rmSync(pidFile, { force: true }); process.exit(0) })
    process.on('SIGTERM', quit)
    process.on('SIGINT', quit)
  }, (err: unknown) => {
    console.error('mail fake: could not start:', err instanceof Error ? err.message : err)
    process.exit(1)
  })
}
