// Worker processes for the fault tests: `tsx workers/index.ts` as a child with its own name, an
// isolating BullMQ prefix, one job at a time and one evaluation thread (the machine is shared).
import { type ChildProcess, spawn } from 'node:child_process'
import { createWriteStream, mkdirSync } from 'node:fs'
import { fileURLToPath } from 'node:url'

const root = fileURLToPath(new URL('../../..', import.meta.url))

export interface WorkerProcess { name: string, child: ChildProcess, output: () => string }

/** Starts a worker and resolves once it listens on all its queues. */
export async function startWorker(name: string, env: Record<string, string>): Promise<WorkerProcess> {
  mkdirSync(`${root}.data`, { recursive: true })
  const log = createWriteStream(`${root}.data/test-worker-${name}.log`)
  const child = spawn(`${root}node_modules/.bin/tsx`, ['workers/index.ts'], {
    cwd: root, stdio: ['ignore', 'pipe', 'pipe'],
    env: { ...process.env, SHEAF_WORKER_NAME: name, SHEAF_WORKER_CONCURRENCY: '1', SHEAF_EVAL_THREADS: '1', ...env }
  })
  let text = ''
  for (const s of [child.stdout!, child.stderr!]) {
    s.on('data', (d: Buffer) => { text += d.toString() })
    s.pipe(log)
  }
  // Loading the worker's sources through tsx and bundling the pool's code take seconds of CPU each.
  const deadline = Date.now() + 300_000
  while ((text.match(/listening on queue/g) ?? []).length < 3 || !text.includes('evaluation pool')) {
    if (child.exitCode !== null) throw new Error(`worker ${name} exited: ${text}`)
    if (Date.now() > deadline) throw new Error(`worker ${name} did not start: ${text}`)
    await new Promise(r => setTimeout(r, 100))
  }
  return { name, child, output: () => text }
}

/** SIGTERM (drain), SIGKILL after 5 s; resolves when it has exited. */
export function stopWorker(w: WorkerProcess, signal: NodeJS.Signals = 'SIGTERM') {
  return new Promise<void>((resolve) => {
    if (w.child.exitCode !== null || w.child.signalCode !== null) return resolve()
    const timer = setTimeout(() => w.child.kill('SIGKILL'), 5000)
    w.child.once('exit', () => { clearTimeout(timer); resolve() })
    w.child.kill(signal)
  })
}
