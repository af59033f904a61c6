// @vitest-environment happy-dom
import { flushPromises, mount } from '@vue/test-utils'
import { createPinia, setActivePinia } from 'pinia'
import { beforeEach, describe, expect, it, vi } from 'vitest'
import StudiesBinsMessages from '~/components/studies/BinsMessages.vue'
import StudiesBinsToolbar from '~/components/studies/BinsToolbar.vue'
import { useBinsDraftStore } from '~/stores/bins-draft'
import { disColumns, goodRow } from '../bins/columns'

async function importFile(wrapper: ReturnType<typeof mount>, name: string, text: string) {
  const input = wrapper.find('input[type=file]')
  Object.defineProperty(input.element, 'files', { value: [new File([text], name, { type: 'text/csv' })], configurable: true })
  await input.trigger('change')
  await flushPromises()
  await new Promise(r => setTimeout(r, 0)) // File.text() resolves on a later task in happy-dom
  await flushPromises()
}

describe('StudiesBinsMessages', () => {
  it('lists at most `limit` items, counts the rest, and emits focus for located items', async () => {
    const items = Array.from({ length: 5 }, (_, i) => ({ message: `row ${i + 1}, column x max: x must be below 1`, row: i, column: 'xMax' }))
    const wrapper = mount(StudiesBinsMessages, { props: { items, title: 'Bins to fix', limit: 3 } })
    expect(wrapper.find('h3').text()).toBe('Bins to fix (5)')
    expect(wrapper.findAll('li')).toHaveLength(3)
    expect(wrapper.text()).toContain('and 2 more.')
    await wrapper.findAll('li button')[1]!.trigger('click')
    expect(wrapper.emitted('focus')![0]).toEqual([items[1]])
  })
  it('renders nothing without items', () => {
    expect(mount(StudiesBinsMessages, { props: { items: [], title: 'x' } }).find('section').exists()).toBe(false)
  })
})

describe('StudiesBinsToolbar', () => {
  beforeEach(() => setActivePinia(createPinia()))

  it('refuses a malformed CSV file with located messages and keeps the bins', async () => {
    const store = useBinsDraftStore()
    store.load([goodRow], disColumns)
    const wrapper = mount(StudiesBinsToolbar)
    await importFile(wrapper, 'bins.csv', 'xMin,xMax,q2Min,q2Max,target\n0.1,0.2,10\n')
    expect(wrapper.find('section').text()).toContain('bins.csv, line 2: 3 fields, but the header has 5')
    expect(store.rows).toEqual([goodRow])
  })

  it('loads a good file into the store and reports ignored columns and cells to fix', async () => {
    const store = useBinsDraftStore()
    store.load([goodRow], disColumns)
    const wrapper = mount(StudiesBinsToolbar)
    await importFile(wrapper, 'bins.csv', 'xMin,xMax,q2Min,q2Max,target,comment\n0.1,0.2,10,20,p,a\n0.5,1,10,20,n,b\n')
    expect(store.rows).toHaveLength(2)
    expect(store.dirty).toBe(true)
    expect(wrapper.find('[role=status]').text()).toBe('Read 2 bins from bins.csv. Columns ignored: comment. 1 cell needs attention (highlighted).')
    expect(wrapper.emitted('imported')![0]).toEqual([2])
    await wrapper.findAll('button').find(b => b.text() === 'Undo')!.trigger('click')
    expect(store.rows).toEqual([goodRow])
  })

  it('exports the bins as CSV, and shows only export when read-only', async () => {
    const store = useBinsDraftStore()
    store.load([goodRow], disColumns)
    const blobs: Blob[] = []
    vi.stubGlobal('URL', Object.assign(URL, { createObjectURL: (b: Blob) => { blobs.push(b); return 'blob:x' }, revokeObjectURL: () => {} }))
    const wrapper = mount(StudiesBinsToolbar, { props: { readonly: true, csvName: 'dy' } })
    expect(wrapper.findAll('button').map(b => b.text())).toEqual(['Export CSV'])
    await wrapper.find('button').trigger('click')
    expect(await blobs[0]!.text()).toBe('xMin,xMax,q2Min,q2Max,target,note\r\n0.01,0.02,10,20,p,\r\n')
    vi.unstubAllGlobals()
  })
})
