// The process supervisor of `npm start`: runs the web app and the worker as child processes and
// restarts whichever ends on its own (a crash, kill -9, an exit), with a growing pause between
// tries, while the other keeps serving. Every start, end and restart is one console line.
// SIGINT (Ctrl-C) or SIGTERM stops both (SIGTERM, then SIGKILL after STOP_GRACE_MS) and exits.
//
//   node --import tsx scripts/supervise.ts   (scripts/start.sh runs it with the environment it prepared)
//
// Env: PORT (the app's port, default 3000), SHEAF_OUTBOX_KEY (passed to the app only),
// SHEAF_SUPERVISE_ONLY=app|worker (run one of them), plus what the app and the worker read.
import { spawn, type ChildProcess } from 'node:child_process'
import { fileURLToPath } from 'node:url'

/** What to run and how. */
export interface ProcessSpec {
  name: string
  command: string
  args: string[]
  env: NodeJS.ProcessEnv
}

/** Pause before the n-th restart in a row (n ≥ 1): 1 s, 2 s, 4 s … at most 30 s. */
export function restartDelayMs(n: number, firstMs = 1000, maxMs = 30_000): number {
  return Math.min(maxMs, firstMs * 2 ** Math.max(0, n - 1))
}

/** A child that has run this long without ending counts as healthy: its next crash waits 1 s again. */
const STABLE_MS = 60_000
/** How long a child may take to stop after SIGTERM (the worker drains its running jobs). */
const STOP_GRACE_MS = 15_000

const log = (text: string) => console.log(`[supervise] ${new Date().toISOString().slice(11, 19)} ${text}`)

/** Runs `specs`, restarting each on an unexpected end; resolves when stopped by a signal. */
export function supervise(specs: ProcessSpec[], cwd: string) {
  let stopping = false
  const children = new Map<string, ChildProcess>()
  const timers = new Set<ReturnType<typeof setTimeout>>()

  function start(spec: ProcessSpec, restarts: number) {
    const startedAt = Date.now()
    // Own process group: Ctrl-C at the terminal reaches the supervisor, which stops the children
    // in order, rather than each child at once.
    const child = spawn(spec.command, spec.args, { cwd, env: spec.env, stdio: 'inherit', detached: true })
    children.set(spec.name, child)
    log(`${spec.name} started (pid ${child.pid})${restarts ? `, restart ${restarts}` : ''}`)
    child.once('error', err => log(`${spec.name} could not start: ${err.message}`))
    child.once('exit', (code, signal) => {
      children.delete(spec.name)
      if (stopping) return
      const ran = Date.now() - startedAt
      const n = ran >= STABLE_MS ? 1 : restarts + 1
      const wait = restartDelayMs(n)
      const how = signal ? `was killed by ${signal}` : `exited with code ${code}`
      log(`${spec.name} (pid ${child.pid}) ${how} after ${(ran / 1000).toFixed(1)} s; restarting in ${(wait / 1000).toFixed(0)} s (the ${specs.filter(s => s !== spec).map(s => s.name).join(' and ') || 'rest'} keeps running)`)
      const timer = setTimeout(() => {
        timers.delete(timer)
        if (!stopping) start(spec, n)
      }, wait)
      timers.add(timer)
    })
  }

  return new Promise<void>((resolve) => {
    async function stop(signal: NodeJS.Signals) {
      if (stopping) return
      stopping = true
      log(`${signal}: stopping ${[...children.keys()].join(' and ') || 'nothing'}`)
      for (const timer of timers) clearTimeout(timer)
      await Promise.all([...children.entries()].map(([name, child]) => new Promise<void>((done) => {
        if (child.exitCode !== null || child.signalCode !== null) return done()
        const kill = setTimeout(() => {
          log(`${name} did not stop within ${STOP_GRACE_MS / 1000} s; SIGKILL`)
          child.kill('SIGKILL')
        }, STOP_GRACE_MS)
        child.once('exit', () => {
          clearTimeout(kill)
          done()
        })
        child.kill('SIGTERM')
      })))
      log('stopped')
      resolve()
    }
    // If the supervisor itself ends without a signal (an error), it takes the children along.
    process.on('exit', () => {
      for (const child of children.values()) child.kill('SIGTERM')
    })
    process.on('SIGINT', () => void stop('SIGINT'))
    process.on('SIGTERM', () => void stop('SIGTERM'))
    process.on('SIGHUP', () => void stop('SIGHUP'))
    for (const spec of specs) start(spec, 0)
  })
}

/** The app and the worker of this checkout, with the environment start.sh exported. */
export function sheafProcesses(env: NodeJS.ProcessEnv = process.env): ProcessSpec[] {
  const { SHEAF_OUTBOX_KEY, ...rest } = env
  const app: ProcessSpec = {
    name: 'app', command: process.execPath, args: ['.output/server/index.mjs'],
    env: { ...rest, HOST: env.HOST ?? '127.0.0.1', PORT: env.PORT ?? '3000', ...(SHEAF_OUTBOX_KEY ? { SHEAF_OUTBOX_KEY } : {}) }
  }
  // tsx as a loader, so the worker is one process (the tsx command would fork another one).
  const worker: ProcessSpec = { name: 'worker', command: process.execPath, args: ['--import', 'tsx', 'workers/index.ts'], env: rest }
  const only = env.SHEAF_SUPERVISE_ONLY
  return only === 'app' ? [app] : only === 'worker' ? [worker] : [app, worker]
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const root = fileURLToPath(new URL('..', import.meta.url))
  await supervise(sheafProcesses(), root)
  process.exit(0)
}
