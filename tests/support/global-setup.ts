import { testEnv } from './env'
import { isHealthy, startStack } from './stack'

// Shared by the integration and browser projects: the first one starts the stack, the other
// finds it healthy and reuses it.
export default async function setup() {
  if (await isHealthy(testEnv().appUrl)) return
  const stop = await startStack()
  return stop
}
