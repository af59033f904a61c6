import { describe, expect, it } from 'vitest'
import { densityWords, setsForKernel, setsForSlot, slotIssues } from '../../../shared/utils/set-match'

const library = [
  { id: 'lead', target: { type: 'nucleus' as const, z: 82, a: 208 } },
  { id: 'proton-a', target: { type: 'proton' as const } },
  { id: 'proton-b', target: { type: 'proton' as const } },
  { id: 'iron', target: { type: 'nucleus' as const, z: 26, a: 56 } }
]

describe('the sets the new-study form pre-selects', () => {
  it('a proton study ticks the proton sets, never the lead set listed first', () => {
    expect(setsForKernel({ sqrtSGeV: 13000 }, library)).toEqual(['proton-a', 'proton-b'])
  })
  it('a DIS study on iron ticks the iron set', () => {
    expect(setsForKernel({ target: { type: 'nucleus', z: 26, a: 56 } }, library)).toEqual(['iron'])
  })
  it('a nuclear ratio runs on proton sets (the nuclear set is its second set)', () => {
    expect(setsForKernel({ base: 'drell-yan', nucleus: { z: 82, a: 208 } }, library)).toEqual(['proton-a', 'proton-b'])
  })
})

describe('which density each slot takes', () => {
  const pdf = { id: 'pdf', name: 'Quillon', version: '1', density: null }
  const pion = { id: 'pion', name: 'TOY-FF-pi+', version: '2', density: { type: 'fragmentation', hadron: 'pi+' } }
  const kaon = { id: 'kaon', name: 'TOY-FF-K+', version: '1', density: { type: 'fragmentation', hadron: 'K+' } }
  const sets = [pdf, pion, kaon]

  it('the form offers parton densities for parton kernels, fragmentation sets where the kernel reads them', () => {
    expect(setsForSlot('dis-nc-f2', 'main', sets).map(s => s.id)).toEqual(['pdf'])
    expect(setsForSlot('sidis-multiplicity', 'main', sets).map(s => s.id)).toEqual(['pdf'])
    expect(setsForSlot('sidis-multiplicity', 'second', sets).map(s => s.id)).toEqual(['pion', 'kaon'])
    expect(setsForSlot('epem-hadron', 'main', sets).map(s => s.id)).toEqual(['pion', 'kaon'])
    expect(setsForSlot('epem-hadron', 'second', sets)).toEqual([])
  })

  it('refuses a set in the wrong slot, naming the field, the set and what is expected', () => {
    expect(slotIssues('dis-nc-f2', [pdf, pion], null)).toEqual([{
      path: ['setIds', 1], message: 'setIds[1]: TOY-FF-pi+ 2 holds fragmentation functions into π⁺, but the kernel dis-nc-f2 reads parton densities in its main sets'
    }])
    expect(slotIssues('sidis-multiplicity', [pdf], pdf)).toEqual([{
      path: ['secondSetId'], message: 'secondSetId: Quillon 1 holds parton densities, but the kernel sidis-multiplicity reads fragmentation functions in its second set'
    }])
    expect(slotIssues('sidis-multiplicity', [pdf], null)[0]!.message).toBe('secondSetId: the kernel sidis-multiplicity needs a second set holding fragmentation functions')
    expect(slotIssues('epem-hadron', [pion], kaon)[0]!.message).toBe('secondSetId: the kernel epem-hadron reads no second set; remove TOY-FF-K+ 1')
    expect(slotIssues('epem-species-ratio', [kaon], pion)).toEqual([])
    expect(densityWords(pdf)).toBe('parton densities')
  })
})
