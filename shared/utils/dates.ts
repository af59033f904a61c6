// How the app shows a moment and a duration: one format everywhere, always with its time zone
// (Intl.DateTimeFormat, English day-month-year words, 24-hour clock). Isomorphic: no DOM, no node:.

export interface DateTextOptions {
  /** IANA zone, e.g. 'UTC' or 'Europe/Berlin'; default: the runtime's own zone (the reader's, in a browser). */
  timeZone?: string
  /** Show seconds too (job times a few seconds apart). Default false. */
  seconds?: boolean
}

const formats = new Map<string, Intl.DateTimeFormat>()

function formatFor({ timeZone, seconds = false }: DateTextOptions): Intl.DateTimeFormat {
  const key = `${timeZone ?? ''}|${seconds}`
  let format = formats.get(key)
  if (!format) {
    format = new Intl.DateTimeFormat('en-GB', {
      year: 'numeric', month: 'short', day: 'numeric',
      hour: '2-digit', minute: '2-digit', ...(seconds ? { second: '2-digit' } : {}), hourCycle: 'h23',
      timeZoneName: 'short', ...(timeZone ? { timeZone } : {})
    })
    formats.set(key, format)
  }
  return format
}

const asDate = (value: string | number | Date) => (value instanceof Date ? value : new Date(value))

/**
 * A moment as "1 Mar 2025, 09:30 UTC" (in Europe/Berlin: "1 Mar 2025, 10:30 CET"). Missing
 * (null, undefined, '') gives '—'; text that is no date is returned as it is, so nothing is hidden.
 */
export function dateTimeText(value: string | number | Date | null | undefined, options: DateTextOptions = {}): string {
  if (value === null || value === undefined || value === '') return '—'
  const date = asDate(value)
  if (Number.isNaN(date.getTime())) return String(value)
  return formatFor(options).format(date)
}

const pad = (n: number) => String(n).padStart(2, '0')

/**
 * A duration in milliseconds as people read it: "0.4 s", "4.2 s", "42 s", "3 min 05 s",
 * "2 h 03 min", "1 d 02 h". Negative or not finite gives '—'.
 */
export function durationText(ms: number): string {
  if (!Number.isFinite(ms) || ms < 0) return '—'
  if (ms < 9_950) return `${(Math.round(ms / 100) / 10).toFixed(1)} s`
  const s = Math.round(ms / 1000)
  if (s < 60) return `${s} s`
  const m = Math.floor(s / 60)
  if (m < 60) return `${m} min ${pad(s % 60)} s`
  const h = Math.floor(m / 60)
  if (h < 24) return `${h} h ${pad(m % 60)} min`
  return `${Math.floor(h / 24)} d ${pad(h % 24)} h`
}

/** The time from `start` to `end` as durationText, or '—' when either is missing or not a date. */
export function elapsedText(start: string | number | Date | null | undefined, end: string | number | Date | null | undefined): string {
  if (start === null || start === undefined || start === '' || end === null || end === undefined || end === '') return '—'
  return durationText(asDate(end).getTime() - asDate(start).getTime())
}
