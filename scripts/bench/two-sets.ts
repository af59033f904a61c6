/**
 * Runs on two sets, the last part of `npm run bench`: the demo sets built by the engine as the
 * seed builds them (Quillon-22, and the Ostrand-25 family for carbon and lead), then two
 * demo-sized studies run inline through the worker's own code (prepareRun, computeRun:
 * evaluation, bands, scale variation) with the second set held at its central member, paired,
 * and varied apart: the rows' evaluation alone and the whole run. Median of 7 after two warm-up
 * runs. Measurements only.
 */
import { loadavg } from 'node:os'
import { parseStudySpec, type StudySpecInput } from '../../shared/physics/study/spec'
import type { ErrorSet } from '../../shared/physics/types'
import { computeRun, evaluateRows, prepareRun } from '../../server/domain/studies/run'
import { buildDemoSet, demoSetList } from '../seed/02-demo-sets'
import { readDemoBins } from '../seed/03-demo-studies'
import type { CliIo } from '../cli/io'

const ms = (t: number) => (t >= 100 ? `${t.toFixed(0)} ms` : `${t.toFixed(1)} ms`)
const median = (v: number[]) => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)]!

/** Median wall times (after two warm-up runs) of the rows' evaluation alone and of the whole inline run. */
async function timeRun(spec: ReturnType<typeof parseStudySpec>, set: ErrorSet, second: ErrorSet) {
  const p = await prepareRun(spec, set, second)
  for (let i = 0; i < 2; i++) await computeRun(p, 68)
  const evaluate: number[] = []
  const whole: number[] = []
  for (let i = 0; i < 7; i++) {
    let t = performance.now()
    await evaluateRows(p, 0, p.members)
    evaluate.push(performance.now() - t)
    t = performance.now()
    await computeRun(p, 68)
    whole.push(performance.now() - t)
  }
  const bands = (await computeRun(p, 68)).bands[0]!
  return { evaluateMs: median(evaluate), ms: median(whole), rows: p.members, variation: p.variation.variation, bands }
}

export async function runTwoSetBench(io: CliIo) {
  const say = (line = '') => io.stdout(`${line}\n`)
  say(`(g) runs on two sets — load average ${loadavg().map(v => v.toFixed(2)).join(' ')}`)
  const list = demoSetList()
  const build = async (key: string) => (await buildDemoSet(list.find(s => s.key === key)!, 'benchmark')).set
  const t0 = performance.now()
  const [proton, carbon, lead] = [await build('hessian'), await build('carbon'), await build('lead')]
  say(`    sets built in ${ms(performance.now() - t0)} (not timed below): ${[proton, carbon, lead].map(s => `${s.header.name} ${s.header.memberCount} members`).join(', ')}`)
  // Another family's carbon: the same numbers, not pairable, so held at its central member.
  const carbonApartFamily: ErrorSet = { ...carbon, header: { ...carbon.header, family: 'bench-other' } }

  const ratio = (extra: Partial<StudySpecInput> = {}) => parseStudySpec({
    kernel: 'nuclear-ratio', options: { base: 'dis-nc-f2', nucleus: { z: 6, a: 12 }, denominator: 'isoscalar' }, bins: readDemoBins('carbon-lead-f2-x.csv'), ...extra
  })
  const dy = (extra: Partial<StudySpecInput> = {}) => parseStudySpec({
    kernel: 'nuclear-ratio', options: { base: 'drell-yan', nucleus: { z: 82, a: 208 }, sqrtSGeV: 8160 }, bins: readDemoBins('ppb-drell-yan-rapidity.csv'), ...extra
  })
  const rows: Array<[string, Awaited<ReturnType<typeof timeRun>>]> = [
    [`C/Pb F₂ ratio, ${ratio().bins.length} bins: Pb varied, C at its central member`, await timeRun(ratio(), lead, carbonApartFamily)],
    [`C/Pb F₂ ratio, ${ratio().bins.length} bins: paired (one family)`, await timeRun(ratio(), lead, carbon)],
    [`C/Pb F₂ ratio, ${ratio().bins.length} bins: varied apart`, await timeRun(ratio({ varySecondSet: true }), lead, carbonApartFamily)],
    [`p Pb / p p Drell–Yan, ${dy().bins.length} bins × ${dy().quadratureOrder} points: Pb varied, proton at its central member`, await timeRun(dy(), lead, proton)],
    [`p Pb / p p Drell–Yan, ${dy().bins.length} bins × ${dy().quadratureOrder} points: varied apart`, await timeRun(dy({ varySecondSet: true }), lead, proton)]
  ]
  rows.forEach(([what, r], i) => {
    const single = rows[i < 3 ? 0 : 3]![1]
    const vs = r === single ? '' : ` (${(r.evaluateMs / single.evaluateMs).toFixed(2)} × and ${(r.ms / single.ms).toFixed(2)} × the single-set run)`
    say(`    ${what}: ${r.rows} rows (${r.variation}): evaluation ${ms(r.evaluateMs)}, whole run ${ms(r.ms)}${vs}`)
  })
  say('    (whole run = evaluation + bands of every prescription + the scale variation, which re-plans the study at three scales)')
  // What pairing does to the band of the ratio: paired against both sets varied apart (quadrature).
  const pct = (v: number | null) => (v === null ? '—' : `${(100 * v).toFixed(2)} %`)
  const [paired, apart] = [rows[1]![1].bands, rows[2]![1].bands]
  const x = ratio().bins.map(b => b.x!)
  say(`    C/Pb band (${paired.prescription}, 68 % CL, +side) at x = ${x.filter((_, i) => i % 3 === 0).join(', ')}:`)
  say(`      paired ${x.map((_, i) => pct(paired.relPlus[i]!)).filter((_, i) => i % 3 === 0).join(', ')}; apart, in quadrature ${x.map((_, i) => pct(apart.relPlus[i]!)).filter((_, i) => i % 3 === 0).join(', ')}`)
}
