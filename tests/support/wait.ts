/** Polls until `check` returns true (for set-up code, where expect.poll is not available). */
export async function waitUntil(check: () => Promise<boolean>, { timeout = 60_000, interval = 250, what = 'the condition' } = {}) {
  const deadline = Date.now() + timeout
  while (Date.now() < deadline) {
    if (await check()) return
    await new Promise((r) => setTimeout(r, interval))
  }
  throw new Error(`timed out after ${timeout} ms waiting for ${what}`)
}
