import { SetFormatError } from '../../../shared/physics/sets/errors'

/** The 400 for a set file the engine refused: the located problem in data.issues. */
export function setFileRejection(err: unknown, fileName: string) {
  if (err instanceof SetFormatError) {
    return createError({ statusCode: 400, statusMessage: `${fileName || 'The file'} is not a valid set file: ${err.message}`, data: { issues: [err.toJSON()] } })
  }
  if (err instanceof RangeError) {
    return createError({ statusCode: 400, statusMessage: `${fileName || 'The file'} is not a valid set file: ${err.message}`, data: { issues: [{ message: err.message }] } })
  }
  return err
}

/** A 422 for a physically meaningless request the engine refused with a RangeError; other errors pass. */
export function engineRejection(err: unknown, what: string) {
  if (err instanceof RangeError) {
    return createError({ statusCode: 422, statusMessage: `${what}: ${err.message}`, data: { issues: [{ message: err.message }] } })
  }
  return err
}
