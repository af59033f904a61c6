import { type ChildProcess, spawn } from 'node:child_process'
import { createWriteStream, mkdirSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { testEnv } from './env'

const root = fileURLToPath(new URL('../..', import.meta.url))
const tsx = `${root}node_modules/.bin/tsx`

export async function isHealthy(appUrl: string) {
  try {
    const res = await fetch(`${appUrl}/api/health`)
    return res.ok
  } catch {
    return false
  }
}

function launch(name: string, cmd: string, args: string[], env: NodeJS.ProcessEnv): ChildProcess {
  mkdirSync(`${root}.data`, { recursive: true })
  const log = createWriteStream(`${root}.data/test-${name}.log`)
  const child = spawn(cmd, args, { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] })
  child.stdout!.pipe(log)
  child.stderr!.pipe(log)
  return child
}

function stopChild(child: ChildProcess) {
  return new Promise<void>((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve()
    const timer = setTimeout(() => child.kill('SIGKILL'), 5000)
    child.once('exit', () => { clearTimeout(timer); resolve() })
    child.kill('SIGTERM')
  })
}

/**
 * Start the mail fake, the built app (.output) and the worker for the tests, wait until
 * /api/health answers ok and return a function that stops all three.
 */
export async function startStack(): Promise<() => Promise<void>> {
  const env = testEnv()
  const url = new URL(env.appUrl)
  const common = { ...process.env, SHEAF_MAIL_FAKE: '1', APP_ORIGIN: env.appUrl, SHEAF_TRUST_PROXY: '1' }
  const children = [
    launch('mail-fake', tsx, ['scripts/mail-fake.ts'], { ...common, MAIL_FAKE_PORT: new URL(env.smtpUrl).port }),
    launch('app', process.execPath, ['.output/server/index.mjs'], { ...common, HOST: url.hostname, PORT: url.port }),
    launch('worker', tsx, ['workers/index.ts'], common)
  ]
  const stop = async () => { await Promise.all(children.map(stopChild)) }
  const deadline = Date.now() + 60_000
  while (!(await isHealthy(env.appUrl))) {
    const dead = children.find(c => c.exitCode !== null)
    if (dead || Date.now() > deadline) {
      await stop()
      throw new Error(`The test stack did not start (see .data/test-app.log, test-worker.log, test-mail-fake.log)`)
    }
    await new Promise(r => setTimeout(r, 200))
  }
  return stop
}
