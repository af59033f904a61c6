import { z } from 'zod'
import { setHeaderSchema } from '../physics/sets/header'

// The neutral set tables (import and export of an error set's members as CSV, TSV or Parquet):
// the header the uploader gives (form or JSON sidecar) and the export's query.

/** Table layouts: long has one row per (member, x, Q², flavour); wide one row per (member, x, Q²). */
export const SET_TABLE_LAYOUTS = ['long', 'wide'] as const
export const SET_TABLE_FORMATS = ['csv', 'tsv', 'parquet'] as const

/**
 * The set header of an imported table: the set file's header without the grid-derived
 * `memberCount` (counted from the table) and `order` (always LO); `family` and `version`
 * default to the name and "1". `density` as in a version-2 set file (absent: parton densities);
 * `target` is required for parton densities and absent for a fragmentation set (the import
 * checks it with densityTargetProblem), whose table names its fraction column z.
 */
export const setTableHeaderSchema = setHeaderSchema
  .omit({ memberCount: true, order: true, family: true, version: true })
  .extend({
    family: setHeaderSchema.shape.family.optional(),
    version: setHeaderSchema.shape.version.optional(),
    target: setHeaderSchema.shape.target.optional()
  })
export type SetTableHeader = z.infer<typeof setTableHeaderSchema>

/** Query of GET …/sets/[sid]/table. */
export const setTableExportQuerySchema = z.object({
  format: z.enum(SET_TABLE_FORMATS, { error: 'Choose format csv, tsv or parquet' }).default('csv'),
  layout: z.enum(SET_TABLE_LAYOUTS, { error: 'Choose layout long or wide' }).default('long'),
  gzip: z.enum(['0', '1'], { error: 'gzip is 0 or 1' }).default('0'),
  /** header=1: the JSON sidecar (the set's header) instead of the table. */
  header: z.enum(['0', '1'], { error: 'header is 0 or 1' }).default('0')
}).strict()
