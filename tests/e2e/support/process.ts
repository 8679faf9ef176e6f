import { readdirSync, readFileSync, readlinkSync } from 'node:fs'

/**
 * The pid of the process listening on a TCP port of 127.0.0.1 (Linux /proc),
 * so a test can read the server's own memory. Null when it cannot be found.
 */
export function listenerPid(port: number): number | null {
  const hexPort = port.toString(16).toUpperCase().padStart(4, '0')
  const inodes = new Set<string>()
  for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
    let text = ''
    try { text = readFileSync(table, 'utf8') }
    catch { continue }
    for (const line of text.split('\n').slice(1)) {
      const cols = line.trim().split(/\s+/)
      // local address "ADDR:PORT", state 0A = LISTEN, inode in column 10
      if (cols[1]?.endsWith(`:${hexPort}`) && cols[3] === '0A' && cols[9]) inodes.add(cols[9])
    }
  }
  if (!inodes.size) return null
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue
    let fds: string[]
    try { fds = readdirSync(`/proc/${entry}/fd`) }
    catch { continue }
    for (const fd of fds) {
      try {
        const m = /^socket:\[(\d+)\]$/.exec(readlinkSync(`/proc/${entry}/fd/${fd}`))
        if (m && inodes.has(m[1]!)) return Number(entry)
      }
      catch { /* gone meanwhile */ }
    }
  }
  return null
}

/** Resident memory of a process in bytes (VmRSS). */
export function residentBytes(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))
  if (!m) throw new Error(`no VmRSS for ${pid}`)
  return Number(m[1]) * 1024
}
