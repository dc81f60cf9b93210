import sharp from 'sharp'
import type { HttpSession } from './http-client'
import { draftAndSend, mug } from './request-fixtures'
import { firingBody } from './studio-fixtures'

/** A small real JPEG (a block of fired-clay colour), as a phone would send. */
export async function clayPhoto(width = 320, height = 240) {
  return sharp({ create: { width, height, channels: 3, background: { r: 170, g: 96, b: 60 } } })
    .jpeg()
    .toBuffer()
}

async function ok(what: string, reply: Promise<{ status: number; body: unknown }>) {
  const answered = await reply
  if (answered.status >= 300) throw new Error(`${what}: ${answered.status} ${JSON.stringify(answered.body)}`)
  return answered.body as any
}

async function uploadPhoto(session: HttpSession, requestId: string, kind: string, name: string) {
  const form = new FormData()
  form.append('kind', kind)
  form.append('photos', new Blob([new Uint8Array(await clayPhoto())], { type: 'image/jpeg' }), name)
  return ok(`photo ${kind}`, session.request('POST', `/api/requests/${requestId}/photos`, undefined, { raw: form }))
}

const hoursAgo = (hours: number) => new Date(Date.now() - hours * 3_600_000).toISOString()

export const DISPUTE_REASON = 'Two mugs came back welded to the shelf; the log shows a long hold at peak.'

/**
 * A request walked the whole way through the API to a dispute, leaving every kind of evidence the desk
 * reads: a deposit taken at the counter, a check-in with notes, the firing's stages, its log, results
 * with a cracked piece, photos from both sides, messages both ways, and the potter's reason.
 */
export async function disputedRequest(studio: HttpSession, potter: HttpSession, kilnId: string) {
  const firing = await ok('firing', studio.post(`/api/kilns/${kilnId}/firings`, firingBody()))
  const firingId = firing.firings[0].id as string
  const sent = await draftAndSend(potter, firingId, [mug({ label: 'Speckled mugs', quantity: 2 })])
  await ok('accept', studio.post(`/api/requests/${sent.id}/accept`))
  await ok('deposit at the counter', studio.post(`/api/requests/${sent.id}/balance/counter`, { note: 'Deposit in cash' }))
  await uploadPhoto(potter, sent.id, 'ware', 'mugs-before.jpg')
  await ok(
    'check-in',
    studio.post(`/api/requests/${sent.id}/check-in`, {
      pieces: [{ pieceIndex: 0, received: 2 }],
      conditionNotes: 'Both mugs dry and clean-footed at drop-off',
    }),
  )
  await uploadPhoto(studio, sent.id, 'check-in', 'mugs-check-in.jpg')
  for (const status of ['closed', 'loading', 'firing', 'cooling', 'unloaded'])
    await ok(`stage ${status}`, studio.post(`/api/firings/${firingId}/stage`, { status, confirm: true }))
  // Orton's self-supporting chart: cone 6 at 1222 °C when the last 100 °C climb at 60 °C/h (published chart).
  await ok(
    'log',
    studio.put(`/api/firings/${firingId}/log`, {
      loadedAt: hoursAgo(40),
      startedAt: hoursAgo(38),
      peakC: 1222,
      finalRateCPerHour: 60,
      holdMinutes: 45,
      offAt: hoursAgo(26),
      openedAt: hoursAgo(8),
      witnessCones: [
        { cone: '5', bend: 'touching' },
        { cone: '6', bend: 'touching' },
        { cone: '7', bend: 'three-oclock' },
      ],
    }),
  )
  await ok(
    'results',
    studio.post(`/api/requests/${sent.id}/results`, {
      outcomes: [{ pieceIndex: 0, outcome: 'stuck-to-shelf', notes: 'Glaze ran onto the shelf on both' }],
      notes: 'The load ran a little hot.',
    }),
  )
  await uploadPhoto(studio, sent.id, 'result', 'mugs-result.jpg')
  await ok('potter message', potter.post(`/api/requests/${sent.id}/messages`, { body: 'The feet were clean when I dropped them off.' }))
  await ok('studio message', studio.post(`/api/requests/${sent.id}/messages`, { body: 'We will grind the shelf and look at the log.' }))
  await ok('dispute', potter.post(`/api/requests/${sent.id}/dispute`, { reason: DISPUTE_REASON }))
  return { requestId: sent.id, firingId }
}
