import { describe, expect, it } from 'vitest'
import { setsForKernel } from '../../../shared/utils/set-match'

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
