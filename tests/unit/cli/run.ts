// Runs the command line in-process and captures what it prints.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { main } from '../../../scripts/cli'

export interface Run {
  code: number
  stdout: string
  stderr: string
}

/** `sheaf <argv…>` with relative file names resolved against `cwd` (default: the repository). */
export async function sheaf(argv: string[], cwd?: string): Promise<Run> {
  let stdout = ''
  let stderr = ''
  const code = await main(argv, { stdout: t => { stdout += t }, stderr: t => { stderr += t }, cwd })
  return { code, stdout, stderr }
}

/** A fresh temporary folder and a cleanup function. */
export function scratch(): { dir: string, file: (name: string, content?: string | Uint8Array) => string, done: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'sheaf-cli-'))
  return {
    dir,
    file: (name, content) => {
      const path = join(dir, name)
      if (content !== undefined) writeFileSync(path, content)
      return path
    },
    done: () => rmSync(dir, { recursive: true, force: true })
  }
}

/** The message of a failed run: exactly one line starting with 'sheaf: '. */
export function oneLine(run: Run): string {
  const lines = run.stderr.split('\n').filter(l => l !== '')
  if (lines.length !== 1 || !lines[0]!.startsWith('sheaf: ')) throw new Error(`expected one 'sheaf: ' line on stderr, got ${JSON.stringify(run.stderr)}`)
  return lines[0]!
}
