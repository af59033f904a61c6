import { readdirSync, readFileSync, readlinkSync, writeFileSync } from 'node:fs'

// The test app runs as a child of the vitest main process (tests/support/stack.ts), out of reach
// of the test files; on Linux it can be found through /proc by the socket listening on its port.

function listeningInodes(port: number): Set<string> {
  const hexPort = port.toString(16).toUpperCase().padStart(4, '0')
  const inodes = new Set<string>()
  for (const table of ['/proc/net/tcp', '/proc/net/tcp6']) {
    let text = ''
    try {
      text = readFileSync(table, 'utf8')
    } catch {
      continue
    }
    for (const line of text.split('\n').slice(1)) {
      const cols = line.trim().split(/\s+/)
      // local_address is "ADDR:PORT" in hex; state 0A is LISTEN; the inode is column 10.
      if (cols.length > 9 && cols[1]!.endsWith(`:${hexPort}`) && cols[3] === '0A') inodes.add(cols[9]!)
    }
  }
  return inodes
}

/** The id of the process listening on `port`, or undefined when /proc does not show it. */
export function pidListeningOn(port: number): number | undefined {
  const inodes = listeningInodes(port)
  if (!inodes.size) return undefined
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue
    let fds: string[]
    try {
      fds = readdirSync(`/proc/${entry}/fd`)
    } catch {
      continue
    }
    for (const fd of fds) {
      try {
        const m = /^socket:\[(\d+)\]$/.exec(readlinkSync(`/proc/${entry}/fd/${fd}`))
        if (m && inodes.has(m[1]!)) return Number(entry)
      } catch { /* the descriptor closed meanwhile */ }
    }
  }
  return undefined
}

function statusField(pid: number, field: 'VmRSS' | 'VmHWM'): number {
  const m = new RegExp(`^${field}:\\s+(\\d+)\\s+kB`, 'm').exec(readFileSync(`/proc/${pid}/status`, 'utf8'))
  if (!m) throw new Error(`no ${field} for process ${pid}`)
  return Number(m[1]) * 1024
}

/** Resident set size of a process in bytes. */
export const rssBytes = (pid: number) => statusField(pid, 'VmRSS')

/** Highest resident set size since start or since {@link resetPeakRss}, in bytes. */
export const peakRssBytes = (pid: number) => statusField(pid, 'VmHWM')

/** Start measuring the peak afresh (Linux: writing 5 to clear_refs resets VmHWM to VmRSS). */
export function resetPeakRss(pid: number) {
  writeFileSync(`/proc/${pid}/clear_refs`, '5')
}
