/**
 * A file size for people, in SI units (1 kB = 1000 bytes, as the International System and
 * IEC 80000-13 define the prefix): "812 bytes", "4.1 kB", "38 kB", "2.3 MB". A small file never
 * reads "0.0 MiB".
 */
export function fileSize(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) throw new RangeError(`A file size is a byte count ≥ 0, got ${bytes}`)
  if (bytes < 1000) return `${bytes} ${bytes === 1 ? 'byte' : 'bytes'}`
  const [value, unit] = bytes < 999_500 ? [bytes / 1e3, 'kB'] : bytes < 999_500_000 ? [bytes / 1e6, 'MB'] : [bytes / 1e9, 'GB']
  return `${value < 9.95 ? value.toFixed(1) : Math.round(value)} ${unit}`
}
