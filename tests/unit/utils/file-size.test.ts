import { describe, expect, it } from 'vitest'
import { fileSize } from '../../../shared/utils/file-size'

describe('fileSize', () => {
  it.each([
    [0, '0 bytes'], [1, '1 byte'], [812, '812 bytes'], [4096, '4.1 kB'], [38_400, '38 kB'],
    [999_499, '999 kB'], [999_500, '1.0 MB'], [2_300_000, '2.3 MB'], [64 * 2 ** 20, '67 MB']
  ])('%d bytes → %s', (bytes, text) => {
    expect(fileSize(bytes)).toBe(text)
  })
  it('never prints a small sample file as 0.0 of a large unit', () => {
    expect(fileSize(3_172)).toBe('3.2 kB')
  })
})
