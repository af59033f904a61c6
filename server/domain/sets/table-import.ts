// Import of a set table (table-format.ts): the header from a form field or JSON sidecar, the
// table streamed twice from its temporary file (survey, then fill), the complete grid written as
// a .sheafset (Float64, so every value is kept bit for bit) and checked by the engine's own set
// rules before anything is stored. Framework-free: the route passes the file's path.
import { stat } from 'node:fs/promises'
import type { DB } from '../../database/client'
import { SetFormatError } from '../../../shared/physics/sets/errors'
import { NO_TARGET, cleanHeader, densityTargetProblem, fractionAxisOf } from '../../../shared/physics/sets/header'
import { writeSetFile } from '../../../shared/physics/sets/write'
import type { ErrorSet, SetHeader } from '../../../shared/physics/types'
import { setTableHeaderSchema, type SetTableHeader } from '../../../shared/utils/set-table-schemas'
import { fieldErrors } from '../../../shared/utils/account-schemas'
import { audit } from '../audit'
import { DomainError, fail } from '../errors'
import { assertSetNameFree, assertStorableHeader, whileSetNameFree } from './library'
import { insertErrorSet } from './store'
import { TableError } from './table-format'
import { GridFill, GridSurvey } from './table-grid'
import { delimitedSource, detectFormat, parquetSource } from './table-read'

/** The header given as JSON text (form field or sidecar file), or 400 naming each bad field. */
export function parseTableHeader(text: string | undefined, where: string): SetTableHeader {
  if (text === undefined) fail(400, 'Give the set header: the form field "header" (JSON) or a JSON sidecar file "sidecar"', { fields: { header: 'The set header is missing' } })
  let json: unknown
  try {
    json = JSON.parse(text)
  } catch (err) {
    fail(400, `${where} is not JSON: ${(err as Error).message}`, { fields: { header: `Not JSON: ${(err as Error).message}` } })
  }
  const parsed = setTableHeaderSchema.safeParse(json)
  if (!parsed.success) {
    const fields = Object.fromEntries(Object.entries(fieldErrors(parsed.error)).map(([k, v]) => [`header.${k}`, v]))
    const [first] = Object.entries(fields)
    fail(400, `${where}: ${first![0]}: ${first![1]}`, { fields })
  }
  const problem = densityTargetProblem(parsed.data, 'header.')
  if (problem) fail(400, `${where}: ${problem.message}`, { fields: { [problem.path]: problem.message } })
  return parsed.data
}

export interface TableImportStats { format: string, gzip: boolean, layout: string, records: number, fileBytes: number, members: number, values: number }

/**
 * Reads a table file into a checked set file (bytes of a .sheafset) without storing anything.
 * 400 with data.issues (line and column, or row group and row) for any problem; 413 when the grid
 * needs more than `maxSetBytes`.
 */
export async function readSetTable(path: string, fileName: string, tableHeader: SetTableHeader, maxSetBytes: number): Promise<{ bytes: Uint8Array, set: ErrorSet, stats: TableImportStats }> {
  try {
    const { format, gzip } = await detectFormat(path, fileName)
    const axis = fractionAxisOf(tableHeader.density)
    const source = format === 'parquet' ? await parquetSource(path, axis) : await delimitedSource(path, format, gzip, axis)
    const survey = new GridSurvey(source.layout)
    await source.read(survey.add)
    survey.end()
    let fill: GridFill
    try {
      fill = new GridFill(survey, maxSetBytes)
    } catch (err) {
      if (err instanceof TableError && /larger than the set limit/.test(err.message)) fail(413, `${fileName}: ${err.message}`, { issues: [err.toJSON()] })
      throw err
    }
    await source.read(fill.add)
    const grid = fill.finish()
    // In memory parton densities are the absent density and a fragmentation set carries NO_TARGET (sets/header.ts).
    const { density, target, ...rest } = tableHeader
    const header: SetHeader = cleanHeader({
      ...rest, family: tableHeader.family ?? tableHeader.name, version: tableHeader.version ?? '1',
      order: 'LO', memberCount: grid.members.length,
      ...(density?.type === 'fragmentation' ? { target: { ...NO_TARGET }, density } : { target: target! })
    })
    const set: ErrorSet = { header, x: grid.x, q2: grid.q2, flavours: grid.flavours, members: grid.members }
    const bytes = writeSetFile(set)
    const stats: TableImportStats = {
      format, gzip, layout: source.layout.kind, records: survey.records, fileBytes: (await stat(path)).size,
      members: grid.members.length, values: grid.members.length * grid.members[0]!.length
    }
    return { bytes, set, stats }
  } catch (err) {
    throw tableRejection(err, fileName)
  }
}

/** A TableError or the engine's SetFormatError as a 400 naming the file and the place. */
export function tableRejection(err: unknown, fileName: string) {
  if (err instanceof DomainError) return err
  if (err instanceof TableError) return new DomainError(400, `${fileName}: ${err.message}`, { issues: [{ file: fileName, ...err.toJSON() }] })
  if (err instanceof SetFormatError) return new DomainError(400, `${fileName} does not make a valid set: ${err.message}`, { issues: [{ file: fileName, ...err.toJSON() }] })
  if (err instanceof RangeError) return new DomainError(400, `${fileName}: ${err.message}`, { issues: [{ file: fileName, message: err.message }] })
  return err
}

/** Store an imported set (the name and version unique in the workspace) with its audit event; its id. */
export async function storeImportedSet(db: DB, o: { workspaceId: string, userId: string, fileName: string, bytes: Uint8Array, header: SetHeader, stats: TableImportStats }) {
  assertStorableHeader(o.header, o.fileName)
  const { name, version } = o.header
  await assertSetNameFree(db, o.workspaceId, name, version)
  return whileSetNameFree(name, version, () => db.transaction(async (tx) => {
    const setId = await insertErrorSet(tx, { workspaceId: o.workspaceId, name, fileName: o.fileName, bytes: o.bytes, origin: 'upload', addedBy: o.userId })
    await audit(tx, {
      workspaceId: o.workspaceId, actorId: o.userId, action: 'set.imported', subjectType: 'error_set', subjectId: setId,
      detail: { name, version, table: o.stats.format, gzip: o.stats.gzip, layout: o.stats.layout, rows: o.stats.records, bytes: o.bytes.byteLength }
    })
    return setId
  }))
}
