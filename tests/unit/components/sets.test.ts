// @vitest-environment happy-dom
import { flushPromises, mount } from '@vue/test-utils'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { dateTimeText } from '#shared/utils/dates'
import { fileSize } from '#shared/utils/file-size'
import { KIND_LABELS, sciText, targetText } from '~/stores/study-view'
import SetsBuildList from '~/components/sets/BuildList.vue'
import SetsSummary from '~/components/sets/Summary.vue'
import SetsTable from '~/components/sets/Table.vue'
import SetsUploadForm from '~/components/sets/UploadForm.vue'

/** A stand-in for XMLHttpRequest that answers every POST with `reply`. */
function fakeXhr(reply: { status: number, body: unknown }) {
  const sent: FormData[] = []
  class FakeXhr {
    status = 0
    responseText = ''
    upload: { onprogress: ((e: { lengthComputable: boolean, loaded: number, total: number }) => void) | null } = { onprogress: null }
    onload: (() => void) | null = null
    onerror: (() => void) | null = null
    open(method: string, url: string) { this.url = `${method} ${url}` }
    url = ''
    setRequestHeader() {}
    send(form: FormData) {
      sent.push(form)
      this.upload.onprogress?.({ lengthComputable: true, loaded: 5, total: 10 })
      queueMicrotask(() => {
        this.status = reply.status
        this.responseText = JSON.stringify(reply.body)
        this.onload?.()
      })
    }
  }
  vi.stubGlobal('XMLHttpRequest', FakeXhr)
  return sent
}

async function choose(wrapper: ReturnType<typeof mount>, file: File) {
  const input = wrapper.find('input[type=file]')
  Object.defineProperty(input.element, 'files', { value: [file], configurable: true })
  await input.trigger('change')
}

describe('SetsUploadForm', () => {
  // The app's auto-import of shared/utils/file-size, given by hand here.
  beforeEach(() => vi.stubGlobal('fileSize', fileSize))
  afterEach(() => vi.unstubAllGlobals())

  it('posts the file with the extra fields and lists the located problems of a refused set', async () => {
    const sent = fakeXhr({ status: 400, body: { statusCode: 400, statusMessage: 'The set file has 2 problems', data: { issues: [
      { message: 'value is NaN', member: 3, xIndex: 17, q2Index: 2, flavour: 21 },
      { message: 'expected a number', line: 12, column: 4 }
    ] } } })
    const wrapper = mount(SetsUploadForm, { props: { url: '/api/sets', fields: { name: 'mine' } } })
    await choose(wrapper, new File(['abc'], 'bramble.sheafset'))
    await wrapper.find('form').trigger('submit')
    await flushPromises()
    expect((sent[0]!.get('file') as File).name).toBe('bramble.sheafset')
    expect(sent[0]!.get('name')).toBe('mine')
    const alert = wrapper.find('[role=alert]').text()
    expect(alert).toContain('The set file has 2 problems')
    expect(alert).toContain('Nothing was stored. 2 problems:')
    expect(wrapper.findAll('li').map(li => li.text())).toEqual([
      'member 3 · x node 17 · Q² node 2 · flavour 21: value is NaN',
      'line 12, column 4: expected a number'
    ])
    expect(wrapper.emitted('failed')![0]![0]).toMatchObject({ status: 400, issues: [{ member: 3 }, { line: 12 }] })
  })

  it('accepts issues given directly as data, and refuses a file over the limit before sending', async () => {
    const sent = fakeXhr({ status: 422, body: { statusMessage: 'Bad grid', data: [{ message: 'x nodes not increasing', xIndex: 4 }] } })
    const wrapper = mount(SetsUploadForm, { props: { url: '/api/sets', maxBytes: 2 ** 20 } })
    await choose(wrapper, new File([new Uint8Array(2 ** 20 + 1)], 'big.set'))
    await wrapper.find('form').trigger('submit')
    expect(sent).toHaveLength(0)
    // Sizes in SI units (shared/utils/file-size.ts): 2^20 + 1 and 2^20 bytes both read 1.0 MB.
    expect(wrapper.find('[role=alert]').text()).toBe('big.set is 1.0 MB; the limit is 1.0 MB.')
    await choose(wrapper, new File(['x'], 'small.set'))
    await wrapper.find('form').trigger('submit')
    await flushPromises()
    expect(wrapper.find('li').text()).toBe('x node 4: x nodes not increasing')
  })

  it('emits the stored set on success', async () => {
    fakeXhr({ status: 201, body: { id: 's1', name: 'Bramble-H' } })
    const wrapper = mount(SetsUploadForm, { props: { url: '/api/sets' } })
    await choose(wrapper, new File(['x'], 'ok.set'))
    await wrapper.find('form').trigger('submit')
    await flushPromises()
    expect(wrapper.emitted('uploaded')![0]).toEqual([{ id: 's1', name: 'Bramble-H' }])
    expect(wrapper.find('[role=status]').text()).toBe('ok.set was read and stored.')
  })
})

describe('SetsSummary', () => {
  const set = {
    name: 'Bramble-H', version: '1.2', kind: 'hessian-pairs', memberCount: 41, confidenceLevelPercent: 90,
    xRange: [1e-5, 1] as [number, number], q2RangeGeV2: [1.69, 1e8] as [number, number],
    target: { type: 'nucleus' as const, z: 26, a: 56 }, addedBy: 'Ana Ruiz', addedAt: '2025-03-01T09:30:00Z'
  }
  it('shows kind, members, CL, ranges, target and who added it', () => {
    const text = mount(SetsSummary, { props: { set }, global: { stubs: { NuxtLink: true } } }).text()
    // the time in the runtime's own zone, in the app's one date format (its own tests pin the zone)
    for (const part of ['Hessian, 20 eigenvector pairs', '41 (central + 40)', '90% as published', '10⁻⁵ to 1', '1.69 to 10⁸ GeV²', 'nucleus Z = 26, A = 56', `Ana Ruiz on ${dateTimeText('2025-03-01T09:30:00Z')}`]) {
      expect(text).toContain(part)
    }
  })
  it('names replicas by count', () => {
    const text = mount(SetsSummary, { props: { set: { ...set, kind: 'replicas', memberCount: 101, target: { type: 'proton' as const } } }, global: { stubs: { NuxtLink: true } } }).text()
    expect(text).toContain('Monte Carlo, 100 replicas')
    expect(text).toContain('proton')
  })
})

describe('SetsBuildList', () => {
  const build = (over: Record<string, unknown>) => ({
    id: 'b1', name: 'Fit-A', state: 'queued' as const, progress: { done: 0, total: 0 }, error: null, setId: null,
    createdAt: '2026-12-04T04:00:00.000Z', cancelRequested: false, ...over
  })
  const textOf = (b: ReturnType<typeof build>) => mount(SetsBuildList, {
    props: { builds: [b], workspaceId: 'w', canCancel: false }, global: { stubs: { NuxtLink: true, UiProgress: true, UiNotice: true } }
  }).text()

  it('says where a waiting build stands on the queue', () => {
    expect(textOf(build({ queuePlace: 1 }))).toContain('queued (next to start)')
    expect(textOf(build({ queuePlace: 2 }))).toContain('(2nd in the queue)')
    expect(textOf(build({ queuePlace: 3 }))).toContain('(3rd in the queue)')
    expect(textOf(build({ queuePlace: 11 }))).toContain('(11th in the queue)')
    expect(textOf(build({ queuePlace: 22 }))).toContain('(22nd in the queue)')
  })

  it('gives no place to a running build or one whose place is unknown', () => {
    expect(textOf(build({ state: 'running', queuePlace: 4 }))).not.toContain('in the queue')
    expect(textOf(build({ queuePlace: null }))).not.toContain('in the queue')
  })
  it('lists the nuclei of a family build with each set\'s name', () => {
    const nuclei = [{ z: 6, a: 12, name: 'Fam-C12' }, { z: 82, a: 208, name: 'Fam-Pb208' }]
    const text = textOf(build({ state: 'done', setId: 's1', setIds: ['s1', 's2'], nuclei }))
    expect(text).toContain('Nuclear family for 2 nuclei')
    expect(text).toContain('(Z = 6, A = 12)')
    expect(text).toContain('(Z = 82, A = 208)')
    expect(text).not.toContain('Open the set')
  })
})

describe('SetsTable', () => {
  const set = (id: string, name: string, family: string, target: { type: string, z?: number, a?: number }) => ({
    id, name, family, version: '1', kind: 'hessian-pairs', memberCount: 3, confidenceLevelPercent: 68, xMin: 1e-5, xMax: 0.9,
    q2MinGeV2: 2, q2MaxGeV2: 1e4, target, addedBy: null, createdAt: '2026-12-04T04:00:00.000Z'
  })

  it('groups the library by family, a family\'s nuclei lightest first', () => {
    const sets = [
      set('1', 'Fam-Pb208', 'Fam', { type: 'nucleus', z: 82, a: 208 }),
      set('2', 'Proton-1', 'Proton', { type: 'proton' }),
      set('3', 'Fam-C12', 'Fam', { type: 'nucleus', z: 6, a: 12 })
    ]
    const wrapper = mount(SetsTable, { props: { sets, workspaceId: 'w', canRename: false, canDelete: false }, global: {
      stubs: { NuxtLink: true, SetsActions: true },
      // The app's auto-imports, given by hand here.
      mocks: { KIND_LABELS, sciText, targetText }
    } })
    const groups = wrapper.findAll('tbody')
    expect(groups.map(g => g.attributes('data-family'))).toEqual(['Fam', 'Proton'])
    expect(groups[0]!.findAll('tr[data-set]').map(r => r.attributes('data-set'))).toEqual(['Fam-C12', 'Fam-Pb208'])
    expect(groups[0]!.text()).toContain('Family Fam · 2 sets · 2 nuclei')
  })
})
