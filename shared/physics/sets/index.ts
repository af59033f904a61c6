/**
 * Error sets: Sheaf's own set-file format (format.ts), its parser and writer, the shared
 * validity rules, and TOY sets for demos and tests.
 */

// File format
export type { SetEncoding } from './format'
export { SET_FILE_MAGIC, SET_FILE_PREAMBLE_BYTES, SET_FORMAT_VERSION, SET_FORMAT_VERSIONS_READ, SET_FILE_EXTENSION, SET_BODY_ORDER, bytesPerValue } from './format'
export type { SetFileHeader } from './header'
export { setHeaderSchema, setFileHeaderSchema, setFileHeaderV1Schema, NO_TARGET, fractionAxisOf, densityTargetProblem, fileSetHeader, memorySetHeader } from './header'

// Errors
export type { SetFormatLocation } from './errors'
export { SetFormatError } from './errors'

// Reading and writing
export type { SetFileSummary } from './parse'
export { readSetHeader, parseSetFile } from './parse'
export type { WriteSetOptions } from './write'
export { validateErrorSet, writeSetFile, assembleSetFile } from './write'

// Validity rules
export { checkXNodes, checkQ2Nodes, checkFlavours, checkMemberCount, checkValuesFinite, checkReplicaMean, thresholdsGeV2 } from './validate'

// TOY sets (analytic, not fits)
export type { ToyQ2Options, ToySetOptions } from './toy'
export { toyXNodes, toyQ2Nodes, toyFlavours, toyXf, toyErrorSet } from './toy'
export { toyZD } from './toy-fragmentation'

// Words for what a set holds (pages, exports, CLI)
export { densityText, densityKey, densityKeyText, densityAxes, flavourText } from './density-words'
