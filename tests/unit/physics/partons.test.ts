import { describe, expect, it } from 'vitest'
import { EVOLVED_FLAVOURS } from '~/shared/physics/input/flavours'
import { PARTONS, isPartonCode, partonCodeSchema, partonLabel, partonName } from '~/shared/physics/partons'

// PDG review "Monte Carlo particle numbering scheme": d 1, u 2, s 3, c 4, b 5, t 6, antiparticles
// with the negative code, g 21, γ 22 (see shared/physics/README.md, "Units and codes").
describe('the parton table', () => {
  it.each([
    [1, 'd', 'down quark'], [2, 'u', 'up quark'], [3, 's', 'strange quark'], [4, 'c', 'charm quark'],
    [5, 'b', 'bottom quark'], [6, 't', 'top quark'],
    [-1, 'd\u0304', 'down antiquark'], [-2, 'u\u0304', 'up antiquark'], [-6, 't\u0304', 'top antiquark'],
    [21, 'g', 'gluon'], [22, 'γ', 'photon']
  ])('PDG %i is %s, the %s', (pdg, name, label) => {
    expect(partonName(pdg)).toBe(name)
    expect(partonLabel(pdg)).toBe(label)
    expect(isPartonCode(pdg)).toBe(true)
  })

  it('holds the 12 quarks and antiquarks, the gluon and the photon, each code once', () => {
    expect(PARTONS.map(p => p.pdg)).toEqual([-6, -5, -4, -3, -2, -1, 1, 2, 3, 4, 5, 6, 21, 22])
  })

  it('names every evolved flavour slot', () => {
    expect(EVOLVED_FLAVOURS.map(partonName).join(' ')).toBe('t\u0304 b\u0304 c\u0304 s\u0304 u\u0304 d\u0304 d u s c b t g')
  })

  it.each([0, 7, -21, 11, 2.5, Number.NaN])('refuses %s', (pdg) => {
    expect(isPartonCode(pdg)).toBe(false)
    expect(() => partonName(pdg)).toThrow(RangeError)
    expect(() => partonName(pdg)).toThrow(/not a parton Sheaf knows \(±1 … ±6, 21 \(gluon\) or 22 \(photon\)\)/)
    expect(partonCodeSchema.safeParse(pdg).success).toBe(false)
  })

  it('the schema accepts every code of the table', () => {
    for (const p of PARTONS) expect(partonCodeSchema.safeParse(p.pdg).success).toBe(true)
  })
})
