// @vitest-environment happy-dom
import { mount } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import { KIND_LABELS, sciText } from '~/stores/study-view'
import { densityKey, densityKeyText, densityText, flavourText } from '#shared/physics/sets/density-words'
import SetsSummary from '~/components/sets/Summary.vue'
import SetsTable from '~/components/sets/Table.vue'

// What a set holds, in the words the library, the set page and the CLI share
// (shared/physics/sets/density-words.ts); the expected words are this feature's definition.

describe('words for what a set holds', () => {
  it.each([
    [{}, 'parton densities in the proton', 'proton'],
    [{ target: { type: 'nucleus', z: 26, a: 56 } }, 'parton densities in the nucleus Z = 26, A = 56', 'nucleus'],
    [{ density: { type: 'fragmentation', hadron: 'pi+' }, target: { type: 'proton' } }, 'fragmentation into π⁺', 'fragmentation:pi+'],
    [{ density: { type: 'fragmentation', hadron: 'h+-' } }, 'fragmentation into h±', 'fragmentation:h+-']
  ] as const)('%j: "%s"', (header, text, key) => {
    expect(densityText(header)).toBe(text)
    expect(densityKey(header)).toBe(key)
  })

  it('names the filter keys and labels the curves', () => {
    expect(densityKeyText('nucleus')).toBe('parton densities in nuclei')
    expect(densityKeyText('fragmentation:K-')).toBe('fragmentation into K⁻')
    expect(flavourText({ type: 'fragmentation', hadron: 'K-' }, 3)).toBe('s → K⁻')
    expect(flavourText(undefined, 21)).toBe('g')
  })
})

describe('a fragmentation set in the summary and the library', () => {
  const base = {
    name: 'toy-ff-pi+', version: '1', kind: 'hessian-pairs', memberCount: 9, confidenceLevelPercent: 68,
    target: { type: 'proton' as const }, addedBy: 'Ana Ruiz'
  }
  it('the summary says what it holds, gives the range in z and no target', () => {
    const text = mount(SetsSummary, {
      props: { set: { ...base, xRange: [0.01, 0.95] as [number, number], q2RangeGeV2: [1, 1e5] as [number, number], density: { type: 'fragmentation' as const, hadron: 'pi+' as const } } },
      global: { stubs: { NuxtLink: true } }
    }).text()
    expect(text).toContain('Holdsfragmentation into π⁺')
    expect(text).toContain('z range0.01 to 0.95')
    expect(text).not.toContain('Target')
  })

  it('the library row says "fragmentation into π⁺" and prefixes its range with z', () => {
    const row = (id: string, name: string, extra: object) => ({
      id, name, family: 'toy', version: '1', kind: 'hessian-pairs', memberCount: 9, confidenceLevelPercent: 68, xMin: 0.01, xMax: 0.95,
      q2MinGeV2: 1, q2MaxGeV2: 1e5, target: { type: 'proton' }, addedBy: null, createdAt: '2026-12-04T04:00:00.000Z', ...extra
    })
    const wrapper = mount(SetsTable, {
      props: { sets: [row('1', 'ff', { density: { type: 'fragmentation', hadron: 'pi+' } }), row('2', 'pdf', { density: { type: 'parton' } })], workspaceId: 'w', canRename: false, canDelete: false },
      global: { stubs: { NuxtLink: true, SetsActions: true }, mocks: { KIND_LABELS, sciText } }
    })
    expect(wrapper.find('[data-set="ff"] [data-holds]').text()).toBe('fragmentation into π⁺')
    expect(wrapper.find('[data-set="pdf"] [data-holds]').text()).toBe('parton densities in the proton')
    expect(wrapper.find('[data-set="ff"]').text()).toContain('z 0.01 – 0.95')
    expect(wrapper.find('[data-set="pdf"]').text()).not.toContain('z 0.01')
  })
})
