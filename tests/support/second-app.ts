import { spawn } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { testEnv } from './env'
import { isHealthy } from './stack'

const root = fileURLToPath(new URL('../..', import.meta.url))

/**
 * A second instance of the built app beside the test stack, with `env` on top of the test
 * environment (APP_ORIGIN is its own address unless `env` says otherwise). Its port is the test
 * app's plus `offset`, so checkouts that run their tests side by side do not collide.
 */
export async function startSecondApp(offset: number, env: Record<string, string> = {}) {
  const port = Number(new URL(testEnv().appUrl).port) + offset
  const url = `http://127.0.0.1:${port}`
  const child = spawn(process.execPath, ['.output/server/index.mjs'], {
    cwd: root, stdio: 'ignore',
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(port), APP_ORIGIN: url, ...env }
  })
  const stop = () => new Promise<void>((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve()
    child.once('exit', () => resolve())
    child.kill('SIGTERM')
  })
  const deadline = Date.now() + 30_000
  while (!(await isHealthy(url))) {
    if (child.exitCode !== null || Date.now() > deadline) {
      await stop()
      throw new Error(`the second app instance on port ${port} did not start`)
    }
    await new Promise(r => setTimeout(r, 150))
  }
  return { url, port, stop }
}
