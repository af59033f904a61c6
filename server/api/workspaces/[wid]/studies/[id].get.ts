import { studyDetail } from '../../../../domain/studies/studies'

// One study with every result version (newest first), its measurements, and the name, version,
// kind and member count of the sets it and its versions name.
export default defineEventHandler(async (event) => {
  const { study } = await requireStudy(event, 'viewer')
  return studyDetail(useDB(), study)
})
