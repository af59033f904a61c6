import { readFileSync } from 'node:fs'
import { parseInputDocument, type InputDocument } from '~/shared/physics/input/parse'

/**
 * Test documents of the nuclear-family tests: the invented lead modification rewritten as R = 1
 * for every piece (no parameters, no members), and the request that builds a set from the central
 * parameter vector alone.
 */

/** The Ostrand-Pb24 modification with every R replaced by the single term 1 (valid for any nucleus). */
export function unitModification(): InputDocument {
  const doc = JSON.parse(readFileSync('samples/fits/ostrand-pb24.json', 'utf8'))
  doc.name = 'Unit-R'
  doc.parameters = []
  delete doc.covariance
  delete doc.members
  for (const m of doc.modifications) m.terms = [{ A: 1, a: 0, b: 0 }]
  return parseInputDocument(doc, 'unit.json')
}

/** A member request for one parameter vector (the central member alone). */
export const centralOnly = (vector: ArrayLike<number> = new Float64Array()) => ({
  type: 'parameters' as const, kind: 'hessian-pairs' as const, confidenceLevelPercent: 68, vectors: [vector], description: 'central only'
})
