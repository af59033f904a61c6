// Registers the payload reducer and reviver of stores/plugins/flat-rows.ts (a payload plugin runs
// before the payload is read in the browser).
import { reduceFlatRows, reviveFlatRows } from './flat-rows'

export default definePayloadPlugin(() => {
  definePayloadReducer('FlatRows', reduceFlatRows)
  definePayloadReviver('FlatRows', reviveFlatRows)
})
