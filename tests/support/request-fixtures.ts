import { CARD_SUCCEEDS, submitCard } from './checkout'
import type { HttpSession } from './http-client'
import { waitUntil } from './wait'

/** A bisqued stoneware mug with a cone 5–10 glaze: fine in a cone 6 oxidation glaze firing. */
export const mug = (overrides: Record<string, unknown> = {}) => ({
  label: 'Mug',
  quantity: 4,
  heightMm: 100,
  widthMm: 90,
  depthMm: 115,
  wallThicknessMm: 6,
  clay: { body: 'stoneware', minCone: '5', maxCone: '10' },
  state: 'bisque',
  boneDry: true,
  glaze: { minCone: '5', maxCone: '10' },
  ...overrides,
})

/** The same mug with a runny glaze: a warning (set it on a catch tray), not a block. */
export const runnyMug = () => mug({ label: 'Runny mug', quantity: 1, glaze: { minCone: '5', maxCone: '10', runny: true } })

/** Greenware not declared bone dry: blocked in any firing. */
export const wetBowl = () => mug({ label: 'Wet bowl', quantity: 1, state: 'greenware', boneDry: false, glaze: undefined })

export async function draftAndSend(potter: HttpSession, firingId: string, pieces: unknown[], acknowledged: string[] = []) {
  const draft = await potter.post(`/api/firings/${firingId}/requests`, { pieces })
  if (draft.status !== 201) throw new Error(`draft: ${draft.status} ${JSON.stringify(draft.body)}`)
  const sent = await potter.post(`/api/requests/${draft.body.id}/send`, {
    acknowledged,
    agreePolicies: true,
    policiesVersion: draft.body.studio.policiesVersion,
  })
  if (sent.status !== 200) throw new Error(`send: ${sent.status} ${JSON.stringify(sent.body)}`)
  return sent.body as { id: string; state: string; volumeL: number; quote: { totalCents: number; depositCents: number } }
}

/**
 * A request sent, accepted by the studio and its deposit paid on the Stripe stand-in's hosted page
 * with the succeeding test card; resolves once the webhook has marked it paid.
 */
export async function sendAndPayDeposit(
  app: { ctx: { db: { query(sql: string, params: unknown[]): Promise<{ state: string }[]> } } },
  studio: HttpSession,
  potter: HttpSession,
  firingId: string,
  pieces: unknown[] = [mug()],
  { keepCard = false, cardNumber = CARD_SUCCEEDS }: { keepCard?: boolean; cardNumber?: string } = {},
) {
  const sent = await draftAndSend(potter, firingId, pieces)
  const accepted = await studio.post(`/api/requests/${sent.id}/accept`)
  if (accepted.status !== 200) throw new Error(`accept: ${accepted.status} ${JSON.stringify(accepted.body)}`)
  const deposit = await potter.post(`/api/requests/${sent.id}/deposit`, keepCard ? { keepCard } : undefined)
  if (deposit.status !== 200) throw new Error(`deposit: ${deposit.status} ${JSON.stringify(deposit.body)}`)
  const paid = await submitCard(deposit.body.checkoutUrl, { cardNumber })
  if (paid.status !== 303) throw new Error(`hosted page answered ${paid.status}`)
  await waitUntil(
    async () => (await app.ctx.db.query('SELECT state FROM firing_requests WHERE id = $1', [sent.id]))[0]?.state === 'deposit_paid',
    { what: 'the deposit webhook' },
  )
  return sent
}
