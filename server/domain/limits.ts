// Resource budgets of studies, runs, set builds and set storage, each with an environment
// override. They are sized so that the largest accepted job fits the worker's memory with room
// to spare; README.md ("Limits") gives the arithmetic behind every number.

export interface Limits {
  /** Bins of one study (SHEAF_STUDY_MAX_BINS). */
  studyMaxBins: number
  /** Quadrature points of one study, all bins and parts together (SHEAF_STUDY_MAX_POINTS). */
  studyMaxPoints: number
  /** Members × bins of one run (SHEAF_RUN_MAX_VALUES). */
  runMaxValues: number
  /** Members × x nodes × Q² nodes × 13 flavours of one set build (SHEAF_BUILD_MAX_VALUES). */
  buildMaxValues: number
  /** Bytes of set files one workspace may store (SHEAF_WORKSPACE_QUOTA_BYTES). */
  workspaceQuotaBytes: number
}

export const DEFAULT_LIMITS: Limits = {
  studyMaxBins: 10_000,
  studyMaxPoints: 100_000,
  runMaxValues: 4_000_000,
  buildMaxValues: 8 * 1024 * 1024,
  workspaceQuotaBytes: 2 * 1024 ** 3
}

type Env = Record<string, string | undefined>

const positiveInteger = (v: string | undefined, fallback: number) => {
  const n = Number(v)
  return v !== undefined && v !== '' && Number.isSafeInteger(n) && n > 0 ? n : fallback
}

/** The limits from `env`, each falling back to its default. */
export function readLimits(env: Env = process.env): Limits {
  return {
    studyMaxBins: positiveInteger(env.SHEAF_STUDY_MAX_BINS, DEFAULT_LIMITS.studyMaxBins),
    studyMaxPoints: positiveInteger(env.SHEAF_STUDY_MAX_POINTS, DEFAULT_LIMITS.studyMaxPoints),
    runMaxValues: positiveInteger(env.SHEAF_RUN_MAX_VALUES, DEFAULT_LIMITS.runMaxValues),
    buildMaxValues: positiveInteger(env.SHEAF_BUILD_MAX_VALUES, DEFAULT_LIMITS.buildMaxValues),
    workspaceQuotaBytes: positiveInteger(env.SHEAF_WORKSPACE_QUOTA_BYTES, DEFAULT_LIMITS.workspaceQuotaBytes)
  }
}

/** The limits of this process, read once. */
export const LIMITS = readLimits()

/** A byte count for messages: "2 GiB", "64 MiB", "1.5 KiB", "812 bytes". */
export function formatBytes(n: number): string {
  const units = ['GiB', 'MiB', 'KiB'] as const
  for (const [i, unit] of units.entries()) {
    const size = 1024 ** (3 - i)
    if (Math.abs(n) >= size) return `${Number((n / size).toPrecision(3))} ${unit}`
  }
  return `${n} bytes`
}

/** A count for messages with thousands separated: 8388608 → "8,388,608". */
export const formatCount = (n: number) => Math.round(n).toLocaleString('en-US')
