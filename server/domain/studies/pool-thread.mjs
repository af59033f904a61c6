// Entry of one evaluation-pool thread (piscina): loads the TypeScript task module through tsx,
// so the thread runs the same sources as the worker process that started it.
import { tsImport } from 'tsx/esm/api'

const mod = await tsImport('./pool-task.ts', import.meta.url)

export default mod.default.default ?? mod.default
