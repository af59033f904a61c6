// zod probes whether it may compile its parsers with `new Function`; under the app's
// Content-Security-Policy (no 'unsafe-eval', server/plugins/security-headers.ts) that probe is
// refused and reported as a violation. In the browser zod parses without it. Set when this module
// is loaded (before any plugin runs, the router's first navigation included), not in setup.
import { z } from 'zod'

z.config({ jitless: true })

export default defineNuxtPlugin(() => {})
