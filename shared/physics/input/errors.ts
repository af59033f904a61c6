/**
 * The error the input layer throws for a bad document: a RangeError (the engine's policy) that
 * carries every problem found, each with its JSON path, so a route can answer 400 with `data`.
 */

/**
 * One problem in a document: where (a JSON path such as `pieces[2].terms[0].a`) and what.
 * `kind` tells a well-formed document whose numbers the engine cannot build from ('physics': a
 * divergent integral, a grid or scale out of range, a covariance that is not positive definite)
 * from one that is malformed ('structure', the default: wrong types, unknown names, shapes).
 */
export interface InputIssue {
  path: string
  message: string
  kind?: 'structure' | 'physics'
}

/** True when every issue is a physics issue (a route answers 422 then, else 400). */
export const onlyPhysics = (issues: readonly InputIssue[]) => issues.length > 0 && issues.every(i => i.kind === 'physics')

/**
 * A document was refused. `message` reads "<source>: <path>: <problem>; …" (at most eight
 * problems spelled out); `issues` has all of them.
 * @example throw new InputError('fit.json', [{ path: 'pieces[0].terms[0].a', message: 'unknown parameter "a_uw"' }])
 */
export class InputError extends RangeError {
  readonly issues: InputIssue[]
  readonly source: string

  constructor(source: string, issues: InputIssue[]) {
    const shown = issues.slice(0, 8).map(i => (i.path ? `${i.path}: ${i.message}` : i.message))
    const more = issues.length > 8 ? `; and ${issues.length - 8} more` : ''
    const count = issues.length > 1 ? `${issues.length} problems: ` : ''
    super(`${source}: ${count}${shown.join('; ')}${more}`)
    this.name = 'InputError'
    this.issues = issues
    this.source = source
  }
}
