import { openApiDocument } from '../domain/openapi/document'

// The OpenAPI 3.1 description of this API (no sign-in needed: it describes, it reveals nothing).
let cached: ReturnType<typeof openApiDocument> | undefined
export default defineEventHandler(() => (cached ??= openApiDocument(useSettings().appOrigin)))
