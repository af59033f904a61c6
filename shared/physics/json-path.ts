/**
 * JSON paths in the dotted/bracketed form the engine's messages use for input documents, set-file
 * headers and values files.
 */

/**
 * A JSON path (as zod reports it) in dotted/bracketed form.
 * @example formatPath(['pieces', 2, 'terms', 0, 'a']) // 'pieces[2].terms[0].a'
 */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = ''
  for (const p of path) {
    if (typeof p === 'number') out += `[${p}]`
    else out += out === '' ? String(p) : `.${String(p)}`
  }
  return out
}
