import { describe, expect, it } from 'vitest'
import { dateTimeText, durationText, elapsedText } from '#shared/utils/dates'

// Every zone is given explicitly, so the results do not depend on the machine's own zone.
describe('dateTimeText', () => {
  it('shows day, month, year, 24-hour time and the zone', () => {
    expect(dateTimeText('2025-03-01T09:30:00Z', { timeZone: 'UTC' })).toBe('1 Mar 2025, 09:30 UTC')
    expect(dateTimeText('2025-03-01T21:05:00Z', { timeZone: 'UTC' })).toBe('1 Mar 2025, 21:05 UTC')
  })

  it('converts to the given zone, with its summer-time name', () => {
    expect(dateTimeText('2025-03-01T09:30:00Z', { timeZone: 'Europe/Berlin' })).toBe('1 Mar 2025, 10:30 CET')
    expect(dateTimeText('2025-07-01T09:30:00Z', { timeZone: 'Europe/Berlin' })).toBe('1 Jul 2025, 11:30 CEST')
    // the calendar day follows the zone too
    expect(dateTimeText('2025-03-01T23:30:00Z', { timeZone: 'Asia/Tokyo' })).toBe('2 Mar 2025, 08:30 GMT+9')
  })

  it('adds seconds on request', () => {
    expect(dateTimeText('2025-03-01T09:30:07Z', { timeZone: 'UTC', seconds: true })).toBe('1 Mar 2025, 09:30:07 UTC')
    expect(dateTimeText('2025-03-01T09:30:07Z', { timeZone: 'UTC' })).toBe('1 Mar 2025, 09:30 UTC')
  })

  it('reads ISO text, epoch milliseconds and Date alike', () => {
    const iso = '2024-12-31T23:59:00Z'
    const want = '31 Dec 2024, 23:59 UTC'
    expect(dateTimeText(iso, { timeZone: 'UTC' })).toBe(want)
    expect(dateTimeText(Date.parse(iso), { timeZone: 'UTC' })).toBe(want)
    expect(dateTimeText(new Date(iso), { timeZone: 'UTC' })).toBe(want)
  })

  it('uses the runtime\'s own zone when none is given', () => {
    const own = new Intl.DateTimeFormat().resolvedOptions().timeZone
    expect(dateTimeText('2025-03-01T09:30:00Z')).toBe(dateTimeText('2025-03-01T09:30:00Z', { timeZone: own }))
  })

  it('shows a dash for a missing time and keeps text that is no date', () => {
    expect(dateTimeText(null)).toBe('—')
    expect(dateTimeText(undefined)).toBe('—')
    expect(dateTimeText('')).toBe('—')
    expect(dateTimeText('next Tuesday', { timeZone: 'UTC' })).toBe('next Tuesday')
  })
})

describe('durationText', () => {
  it('uses tenths of a second below ten seconds', () => {
    expect(durationText(0)).toBe('0.0 s')
    expect(durationText(350)).toBe('0.4 s')
    expect(durationText(4_240)).toBe('4.2 s')
    expect(durationText(9_949)).toBe('9.9 s')
  })

  it('uses whole seconds, then minutes and seconds, hours and minutes, days and hours', () => {
    expect(durationText(9_950)).toBe('10 s')
    expect(durationText(42_000)).toBe('42 s')
    expect(durationText(59_600)).toBe('1 min 00 s')
    expect(durationText(185_000)).toBe('3 min 05 s')
    expect(durationText((2 * 3600 + 3 * 60) * 1000)).toBe('2 h 03 min')
    expect(durationText((26 * 3600 + 10) * 1000)).toBe('1 d 02 h')
  })

  it('shows a dash for a negative or not finite duration', () => {
    expect(durationText(-1)).toBe('—')
    expect(durationText(Number.NaN)).toBe('—')
    expect(durationText(Number.POSITIVE_INFINITY)).toBe('—')
  })
})

describe('elapsedText', () => {
  it('measures from start to end, and shows a dash while either is missing', () => {
    expect(elapsedText('2025-03-01T09:30:00Z', '2025-03-01T09:33:05Z')).toBe('3 min 05 s')
    expect(elapsedText('2025-03-01T09:30:00.000Z', '2025-03-01T09:30:01.250Z')).toBe('1.3 s')
    expect(elapsedText('2025-03-01T09:30:00Z', null)).toBe('—')
    expect(elapsedText(null, '2025-03-01T09:30:00Z')).toBe('—')
    expect(elapsedText('not a date', '2025-03-01T09:30:00Z')).toBe('—')
  })
})
