// npm run bench:load: measures a running Sheaf (npm start) from outside, over loopback HTTP, as
// the demo analyst:
//   1. the Run route on a 10,000-bin study: answer time (target ≤ 300 ms),
//   2. a finished 10,000-bin result: the study page's result request, payload and time, per page
//      of bins and in full, and bands for another prescription/CL computed on the server,
//   3. 50 concurrent viewers (autocannon) on a demo result's API and on its study page: p50, p95
//      and p99 of the response time (target p95 < 300 ms), and the study page's server-rendered
//      size.
// Env: BENCH_URL (default http://127.0.0.1:$PORT or :3000), BENCH_SECONDS (per load run, 10),
// BENCH_CONNECTIONS (50), BENCH_BINS (10000). Leaves one 10,000-bin study "Load benchmark
// study" in the demo workspace (reused on the next run).
import autocannon from 'autocannon'

const BASE = process.env.BENCH_URL ?? `http://127.0.0.1:${process.env.PORT ?? 3000}`
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10)
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50)
const BINS = Number(process.env.BENCH_BINS ?? 10_000)
const STUDY_NAME = 'Load benchmark study'
const P95_TARGET_MS = 300
const RUN_TARGET_MS = 300

let cookie = ''

interface Answer<T> { status: number, body: T, bytes: number, ms: number }

async function call<T = unknown>(method: string, path: string, body?: unknown): Promise<Answer<T>> {
  const t0 = performance.now()
  const res = await fetch(BASE + path, {
    method,
    headers: { origin: BASE, cookie, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body)
  })
  const text = await res.text()
  const ms = performance.now() - t0
  for (const c of res.headers.getSetCookie()) {
    const [pair] = c.split(';')
    const [name] = pair!.split('=')
    cookie = [...cookie.split('; ').filter(p => p && !p.startsWith(`${name}=`)), pair].join('; ')
  }
  let parsed: unknown = text
  try {
    parsed = JSON.parse(text)
  } catch { /* a page */ }
  return { status: res.status, body: parsed as T, bytes: Buffer.byteLength(text), ms }
}

function must<T>(a: Answer<T>, what: string, ...ok: number[]): T {
  if (!ok.includes(a.status)) throw new Error(`${what}: HTTP ${a.status} ${JSON.stringify(a.body).slice(0, 400)}`)
  return a.body
}

const kB = (bytes: number) => `${(bytes / 1024).toFixed(1)} kB`
const ms = (v: number) => `${v.toFixed(0)} ms`
const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))]!
const median = (v: number[]) => percentile([...v].sort((a, b) => a - b), 50)
const sleep = (t: number) => new Promise(r => setTimeout(r, t))

async function waitEnded(wid: string, rid: string, timeoutMs = 180_000) {
  const until = Date.now() + timeoutMs
  for (;;) {
    const r = must(await call<{ state: string }>('GET', `/api/workspaces/${wid}/results/${rid}/progress`), 'progress', 200)
    if (['done', 'failed', 'cancelled'].includes(r.state)) return r.state
    if (Date.now() > until) throw new Error(`result ${rid} did not end within ${timeoutMs / 1000} s`)
    await sleep(250)
  }
}

/** Load on `path` with the session cookie; every response time, from autocannon's response event. */
async function load(path: string) {
  const times: number[] = []
  const statuses = new Map<number, number>()
  const instance = autocannon({ url: BASE + path, connections: CONNECTIONS, duration: SECONDS, headers: { cookie } })
  instance.on('response', (_client: unknown, status: number, _bytes: number, responseTime: number) => {
    times.push(responseTime)
    statuses.set(status, (statuses.get(status) ?? 0) + 1)
  })
  const result = await instance
  times.sort((a, b) => a - b)
  return {
    requests: times.length, perSecond: result.requests.average, bytesPerResponse: result.throughput.total / Math.max(1, times.length),
    p50: percentile(times, 50), p95: percentile(times, 95), p99: percentile(times, 99), errors: result.errors + result.timeouts,
    statuses: Object.fromEntries(statuses)
  }
}

async function main() {
  console.log(`Sheaf load benchmark against ${BASE} (${CONNECTIONS} connections, ${SECONDS} s per load run)`)
  must(await call('POST', '/api/auth/signin', { email: 'analyst@demo.sheaf.test', password: 'sheaf-analyst-demo-1' }), 'sign in as the demo analyst (is the demo seeded?)', 200)
  const { workspaces } = must(await call<{ workspaces: Array<{ id: string, name: string }> }>('GET', '/api/workspaces'), 'workspaces', 200)
  const wid = workspaces[0]!.id
  cookie += `; sheaf_workspace=${wid}`
  const { sets } = must(await call<{ sets: Array<{ id: string, name: string, kind: string, memberCount: number, xMin: number, xMax: number, q2MinGeV2: number, q2MaxGeV2: number, density?: { type: string } }> }>('GET', `/api/workspaces/${wid}/sets`), 'sets', 200)
  // The smallest Hessian set of parton densities (F₂ reads no fragmentation set).
  const partons = sets.filter(s => s.density?.type !== 'fragmentation')
  const set = partons.filter(s => s.kind === 'hessian-pairs').sort((a, b) => a.memberCount - b.memberCount)[0] ?? partons[0]!

  // ── 1. The Run route on a large study
  const { studies } = must(await call<{ studies: Array<{ id: string, name: string, binCount: number }> }>('GET', `/api/workspaces/${wid}/studies`), 'studies', 200)
  let big = studies.find(s => s.name === STUDY_NAME && s.binCount === BINS)
  if (!big) {
    // F₂ on a log grid in x and Q² well inside the set's grid (points, not ranges).
    const nx = 100
    const nq = Math.ceil(BINS / nx)
    const x0 = Math.max(set.xMin * 2, 1e-4)
    const x1 = Math.min(set.xMax / 2, 0.5)
    const q0 = Math.max(set.q2MinGeV2 * 2, 4)
    const q1 = Math.min(set.q2MaxGeV2 / 2, 1e4)
    const bins = Array.from({ length: BINS }, (_, i) => {
      const ix = i % nx
      const iq = Math.floor(i / nx)
      return { x: x0 * (x1 / x0) ** (ix / (nx - 1)), q2: q0 * (q1 / q0) ** (iq / Math.max(1, nq - 1)) }
    })
    const made = await call<{ id: string }>('POST', `/api/workspaces/${wid}/studies`, { name: STUDY_NAME, spec: { kernel: 'dis-nc-f2', bins }, setIds: [set.id] })
    big = { id: must(made, 'create the large study', 201).id, name: STUDY_NAME, binCount: BINS }
    console.log(`made "${STUDY_NAME}": ${BINS} bins on ${set.name} (${set.memberCount} members) in ${ms(made.ms)}`)
  }
  const runTimes: number[] = []
  let doneId: string | null = null
  for (let i = 0; i < 5; i++) {
    const run = await call<{ results: Array<{ id: string, state: string }> }>('POST', `/api/workspaces/${wid}/studies/${big.id}/run`, {})
    const rid = must(run, 'run the large study', 202).results[0]!.id
    runTimes.push(run.ms)
    if (i < 4) {
      must(await call('POST', `/api/workspaces/${wid}/results/${rid}/cancel`, {}), 'cancel', 200, 409)
      await waitEnded(wid, rid)
    } else {
      const state = await waitEnded(wid, rid)
      if (state === 'done') doneId = rid
      else console.log(`the last run of the large study ended ${state}`)
    }
  }
  const runMedian = median(runTimes)
  console.log(`\n1. Run route, ${BINS}-bin study: ${runTimes.map(ms).join(', ')}; median ${ms(runMedian)}, max ${ms(Math.max(...runTimes))} (target ≤ ${RUN_TARGET_MS} ms: ${Math.max(...runTimes) <= RUN_TARGET_MS ? 'met' : 'NOT met'})`)

  // ── 2. A finished large result, as the study page asks for it
  if (doneId) {
    const path = `/api/workspaces/${wid}/results/${doneId}`
    const full = must(await call<{ bins?: { total: number } }>('GET', `${path}?binsLimit=all`), 'result in full', 200)
    const fullA = await call('GET', `${path}?binsLimit=all`)
    const first = await call<{ bins?: { offset: number, limit: number, total: number } }>('GET', path)
    const firstAgain = await call('GET', path)
    const other = await call('GET', `${path}?cl=90`)
    const otherAgain = await call('GET', `${path}?cl=90`)
    const page = await call('GET', `${path}?binsOffset=5000&binsLimit=1000`)
    const study = await call('GET', `/api/workspaces/${wid}/studies/${big.id}`)
    console.log(`\n2. Finished ${BINS}-bin result (${set.name}, ${set.memberCount} members):`)
    console.log(`   study (spec and versions)          ${kB(study.bytes).padStart(9)}  ${ms(study.ms).padStart(7)}`)
    console.log(`   result, first page of bins          ${kB(first.bytes).padStart(9)}  ${ms(first.ms).padStart(7)} (again ${ms(firstAgain.ms)})${first.body.bins ? `; page ${first.body.bins.limit} of ${first.body.bins.total} bins` : ''}`)
    console.log(`   result, bins 5001–6000              ${kB(page.bytes).padStart(9)}  ${ms(page.ms).padStart(7)}`)
    console.log(`   result, all bins                    ${kB(fullA.bytes).padStart(9)}  ${ms(fullA.ms).padStart(7)}${full.bins ? '' : ' (no paging offered)'}`)
    console.log(`   another CL (90 %), first time/again ${kB(other.bytes).padStart(9)}  ${ms(other.ms).padStart(7)} / ${ms(otherAgain.ms)}`)
  }

  // ── 3. 50 concurrent viewers on a demo result and its study page
  const demo = studies.filter(s => s.name !== STUDY_NAME).sort((a, b) => a.binCount - b.binCount).at(-1)!
  const detail = must(await call<{ results: Array<{ id: string, state: string }> }>('GET', `/api/workspaces/${wid}/studies/${demo.id}`), 'demo study', 200)
  const result = detail.results.find(r => r.state === 'done')!
  const page = await call<string>('GET', `/studies/${demo.id}`)
  const payload = /<script[^>]*id="__NUXT_DATA__"[^>]*>([\s\S]*?)<\/script>/.exec(page.body)?.[1] ?? ''
  console.log(`\n3. Study page "${demo.name}" (${demo.binCount} bins), server-rendered: ${kB(page.bytes)} (payload ${kB(Buffer.byteLength(payload))}), ${ms(page.ms)} alone`)
  const targets = [
    ['result API', `/api/workspaces/${wid}/results/${result.id}`],
    ['study page', `/studies/${demo.id}`]
  ] as const
  let worst = 0
  for (const [name, path] of targets) {
    const r = await load(path)
    worst = Math.max(worst, r.p95)
    const bad = Object.entries(r.statuses).filter(([s]) => s !== '200')
    console.log(`   ${name.padEnd(11)} ${r.requests} requests (${r.perSecond.toFixed(0)}/s, ${kB(r.bytesPerResponse)} each): p50 ${ms(r.p50)}, p95 ${ms(r.p95)}, p99 ${ms(r.p99)}${r.errors ? `, ${r.errors} errors` : ''}${bad.length ? `, statuses ${JSON.stringify(r.statuses)}` : ''}`)
  }
  console.log(`   p95 target < ${P95_TARGET_MS} ms: ${worst < P95_TARGET_MS ? 'met' : 'NOT met'} (worst p95 ${ms(worst)}, ${(worst / P95_TARGET_MS).toFixed(2)} of the target)`)
}

await main()
