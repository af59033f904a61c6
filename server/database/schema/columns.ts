// Column helpers shared by the table modules: timestamps and bytea. Imports no table.
import { customType, timestamp } from 'drizzle-orm/pg-core'

export const createdAt = () => timestamp({ withTimezone: true }).notNull().defaultNow()
export const updatedAt = () => timestamp({ withTimezone: true }).notNull().defaultNow().$onUpdate(() => new Date())

/** createdAt and updatedAt, spread into a table's columns. */
export const timestamps = () => ({ createdAt: createdAt(), updatedAt: updatedAt() })

/** PostgreSQL bytea as a Node Buffer (pg returns Buffer for bytea). */
export const bytea = customType<{ data: Buffer, driverData: Buffer }>({
  dataType: () => 'bytea'
})
