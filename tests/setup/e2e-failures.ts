// When an end-to-end test fails, print where every open page stood: its address, the alerts on it and
// the API calls it was refused. A failure on a busy CI machine then says what the browser saw.
import { beforeEach } from 'vitest'
import { describeOpenPages } from '../support/browser'

beforeEach(({ onTestFailed }) => {
  onTestFailed(async () => {
    console.log(`[e2e] pages at the failure:\n${await describeOpenPages()}`)
  })
})
