// @vitest-environment happy-dom
import { mount } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import { dateTimeText } from '#shared/utils/dates'
import JobsTable, { type JobEntry } from '~/components/jobs/Table.vue'

const entry = (over: Partial<JobEntry>): JobEntry => ({
  id: 'j', kind: 'run', state: 'done', progress: 1, title: 'Proton F2 at low x', detail: 'toy-hessian 1, version 1',
  link: '/studies/s1', requestedByName: 'Ana Ruiz', queuedAt: '2025-03-01T09:30:00Z', startedAt: '2025-03-01T09:30:02Z',
  finishedAt: '2025-03-01T09:33:07Z', error: null, ...over
})
const mountTable = (jobs: JobEntry[]) => mount(JobsTable, { props: { jobs }, global: { stubs: { NuxtLink: { props: ['to'], template: '<a :href="to"><slot /></a>' } } } })
const cells = (row: ReturnType<ReturnType<typeof mountTable>['find']>) => row.findAll('td').map(td => td.text())
const times = (row: ReturnType<ReturnType<typeof mountTable>['find']>) => row.findAll('td')[4]!.findAll(':scope > span').map(s => s.text().replace(/\s+/g, ' '))

describe('JobsTable', () => {
  it('shows what, detail, who, state, the three times, the duration and a link to the page', () => {
    const row = mountTable([entry({})]).find('[data-job-id="j"]')
    expect(row.attributes('data-job-state')).toBe('done')
    const text = cells(row)
    expect(text.slice(0, 4)).toEqual(['Study runProton F2 at low x', '—toy-hessian 1, version 1', 'Ana Ruiz', 'done'])
    // The three times stacked in one cell, each with its word.
    expect(times(row)).toEqual([
      `queued ${dateTimeText('2025-03-01T09:30:00Z', { seconds: true })}`,
      `started ${dateTimeText('2025-03-01T09:30:02Z', { seconds: true })}`,
      `finished ${dateTimeText('2025-03-01T09:33:07Z', { seconds: true })}`
    ])
    expect(text.slice(5)).toEqual(['3 min 05 s', ''])
    expect(row.find('td span').text()).toBe('Study run')
    expect(row.find('a').text()).toBe('Proton F2 at low x')
    expect(row.find('a').attributes('href')).toBe('/studies/s1')
    expect(row.find('[role=progressbar]').exists()).toBe(false)
  })

  it('shows the progress of running work, and no finish time or duration yet', () => {
    const row = mountTable([entry({ id: 'b', kind: 'build', state: 'running', progress: 0.426, title: 'my fit', finishedAt: null, requestedByName: null })]).find('[data-job-id="b"]')
    expect(row.find('[role=progressbar]').attributes('aria-valuenow')).toBe('43')
    expect(row.find('[data-job-percent]').text()).toBe('43 %')
    const text = cells(row)
    expect(row.find('td span').text()).toBe('Set build')
    expect(row.find('a').text()).toBe('my fit')
    expect(text[2]).toBe('—')
    // Started but not finished: no finish time yet.
    expect(times(row).map(t => t.split(' ')[0])).toEqual(['queued', 'started'])
  })

  it('gives the reason of a failure, or says none was recorded', () => {
    const table = mountTable([entry({ id: 'f1', state: 'failed', error: 'bin 3: x = 2 is outside (0, 1)' }), entry({ id: 'f2', state: 'failed', error: null })])
    expect(cells(table.find('[data-job-id="f1"]')).at(-1)).toBe('bin 3: x = 2 is outside (0, 1)')
    expect(cells(table.find('[data-job-id="f2"]')).at(-1)).toBe('No reason recorded')
  })
})
