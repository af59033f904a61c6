// zod probes whether it may compile its parsers with `new Function`; under the app's
// Content-Security-Policy (no 'unsafe-eval', server/plugins/security-headers.ts) that probe is
// refused and reported as a violation on every page. In the browser zod parses without it.
import { z } from 'zod'

export default defineNuxtPlugin(() => {
  z.config({ jitless: true })
})
