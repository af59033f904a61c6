// The few parts of autocannon (no types on the registry for this version) that bench-load.ts uses.
declare module 'autocannon' {
  import type { EventEmitter } from 'node:events'

  interface Options { url: string, connections?: number, duration?: number, headers?: Record<string, string> }
  interface Result {
    requests: { average: number, total: number }
    throughput: { average: number, total: number }
    errors: number
    timeouts: number
  }
  interface Instance extends EventEmitter, PromiseLike<Result> {}
  function autocannon(options: Options): Instance
  export default autocannon
}
