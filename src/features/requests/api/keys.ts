// The requests feature reads the shared key tree (src/lib/queryKeys.ts): requests under `requests`,
// the firing, kiln and studio they are made against under those resources' own keys.
export { keys as requestKeys } from '../../../lib/queryKeys'
