// scripts/supervise.ts, as npm start runs it: kill -9 of the worker or of the app restarts that
// one process while the other keeps answering, the console says what happened, and SIGINT
// (Ctrl-C) stops both. Runs its own app and worker on the test services, beside the test stack.
import { spawn, type ChildProcess } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { afterAll, describe, expect, it } from 'vitest'
import { testEnv } from '../../support/env'
import { isHealthy } from '../../support/stack'

const root = fileURLToPath(new URL('../../..', import.meta.url))
// The test app's port plus this offset (see startSecondApp), so side-by-side checkouts do not collide.
const port = Number(new URL(testEnv().appUrl).port) + 37
const url = `http://127.0.0.1:${port}`

let supervisor: ChildProcess | undefined
let output = ''

const alive = (pid: number) => {
  try {
    process.kill(pid, 0)
    return true
  } catch {
    return false
  }
}

/** Waits until the supervisor's output matches `pattern` (after `from` characters); the match. */
async function waitFor(pattern: RegExp, from = 0, ms = 45_000): Promise<RegExpMatchArray> {
  const deadline = Date.now() + ms
  for (;;) {
    const m = output.slice(from).match(pattern)
    if (m) return m
    if (Date.now() > deadline) throw new Error(`no ${pattern} in the supervisor's output:\n${output.slice(-3000)}`)
    await new Promise(r => setTimeout(r, 100))
  }
}

async function waitHealthy(ms = 45_000) {
  const deadline = Date.now() + ms
  while (!(await isHealthy(url))) {
    if (Date.now() > deadline) throw new Error(`the supervised app on ${url} did not answer:\n${output.slice(-3000)}`)
    await new Promise(r => setTimeout(r, 150))
  }
}

afterAll(() => {
  if (supervisor && supervisor.exitCode === null) supervisor.kill('SIGKILL')
})

describe('the process supervisor of npm start', () => {
  it('restarts a killed worker while the app keeps answering, then a killed app, and stops both on SIGINT', { timeout: 180_000 }, async () => {
    supervisor = spawn(process.execPath, ['--import', 'tsx', 'scripts/supervise.ts'], {
      cwd: root, stdio: ['ignore', 'pipe', 'pipe'],
      env: { ...process.env, HOST: '127.0.0.1', PORT: String(port), APP_ORIGIN: url }
    })
    supervisor.stdout!.on('data', (b: Buffer) => { output += b.toString() })
    supervisor.stderr!.on('data', (b: Buffer) => { output += b.toString() })

    const workerPid = Number((await waitFor(/worker started \(pid (\d+)\)/))[1])
    const appPid = Number((await waitFor(/app started \(pid (\d+)\)/))[1])
    await waitHealthy()

    // kill -9 of the worker: the app answers throughout, the worker comes back as a new process.
    let mark = output.length
    process.kill(workerPid, 'SIGKILL')
    const answers: boolean[] = []
    const watching = (async () => {
      const until = Date.now() + 2500
      while (Date.now() < until) {
        answers.push(await isHealthy(url))
        await new Promise(r => setTimeout(r, 100))
      }
    })()
    await waitFor(new RegExp(`worker \\(pid ${workerPid}\\) was killed by SIGKILL after [\\d.]+ s; restarting in 1 s \\(the app keeps running\\)`), mark)
    const newWorker = Number((await waitFor(/worker started \(pid (\d+)\), restart 1/, mark))[1])
    await watching
    expect(answers.length).toBeGreaterThan(5)
    expect(answers.every(Boolean)).toBe(true)
    expect(newWorker).not.toBe(workerPid)
    expect(alive(workerPid)).toBe(false)
    await new Promise(r => setTimeout(r, 1500))
    expect(alive(newWorker)).toBe(true)
    expect(alive(appPid)).toBe(true)

    // kill -9 of the app: it is started again and answers; the worker was left alone.
    mark = output.length
    process.kill(appPid, 'SIGKILL')
    await waitFor(new RegExp(`app \\(pid ${appPid}\\) was killed by SIGKILL after [\\d.]+ s; restarting in 1 s \\(the worker keeps running\\)`), mark)
    const newApp = Number((await waitFor(/app started \(pid (\d+)\), restart 1/, mark))[1])
    await waitHealthy()
    expect(newApp).not.toBe(appPid)
    expect(alive(newWorker)).toBe(true)

    // Ctrl-C: both stop and the supervisor exits.
    const exited = new Promise<number | null>(resolve => supervisor!.once('exit', code => resolve(code)))
    supervisor.kill('SIGINT')
    expect(await exited).toBe(0)
    await waitFor(/SIGINT: stopping/)
    expect(alive(newApp)).toBe(false)
    expect(alive(newWorker)).toBe(false)
    expect(await isHealthy(url)).toBe(false)
  })
})
