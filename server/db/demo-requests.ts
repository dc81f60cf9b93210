// Demo requests, so the board has life on first start: a firing nearly full whose ware is checked in
// as tagged pieces and planned on its shelves, requests waiting for a decision, a paid deposit, a
// draft, and past firings picked up (one answered for by both sides). Money in flight was taken "at
// the counter", so seeding never calls Stripe; the picked-up past firings were paid by card, and that
// payment is made through Stripe (the local stand-in) after start, by demo-payouts.ts. Each request is
// found again by the key its first timeline entry carries.
import type { EntityManager } from 'typeorm'
import type { Piece } from '../../shared/firing/check'
import { itemApplies } from '../../shared/schemas/pieces'
import type { RequestState } from '../../shared/workflow/request-states'
import { CheckIn } from '../entities/CheckIn'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { Kiln } from '../entities/Kiln'
import { LedgerEntry } from '../entities/LedgerEntry'
import { RequestEvent } from '../entities/RequestEvent'
import { RequestMessage } from '../entities/RequestMessage'
import { Review } from '../entities/Review'
import { Studio } from '../entities/Studio'
import { insertPiece } from '../services/pieces'
import { StudioMember } from '../entities/StudioMember'
import { checkAgainstFiring } from '../services/requests'
import { reviewWindowClosesAt } from '../../shared/reviews'

const stoneware = { body: 'stoneware' as const, minCone: '5', maxCone: '10' }
const glaze6 = { minCone: '5', maxCone: '7' }

const MUGS: Piece = {
  label: 'Ash-glazed mugs',
  quantity: 6,
  heightMm: 105,
  widthMm: 90,
  depthMm: 120,
  wallThicknessMm: 6,
  clay: stoneware,
  state: 'bisque',
  boneDry: true,
  glaze: glaze6,
}
const VASES: Piece = {
  label: 'Tall vases',
  quantity: 4,
  heightMm: 400,
  widthMm: 250,
  depthMm: 250,
  round: true,
  wallThicknessMm: 9,
  clay: stoneware,
  state: 'bisque',
  boneDry: true,
  glaze: glaze6,
}
const CELADON_BOWLS: Piece = {
  label: 'Celadon bowls',
  quantity: 4,
  heightMm: 90,
  widthMm: 200,
  depthMm: 200,
  round: true,
  wallThicknessMm: 7,
  clay: { body: 'porcelain', minCone: '9', maxCone: '11' },
  state: 'bisque',
  boneDry: true,
  glaze: { minCone: '9', maxCone: '11', runny: true, support: 'cookie' },
}
const GREEN_PLATES: Piece = {
  label: 'Greenware plates',
  quantity: 8,
  heightMm: 30,
  widthMm: 260,
  depthMm: 260,
  round: true,
  wallThicknessMm: 8,
  clay: stoneware,
  state: 'greenware',
  boneDry: true,
}

interface DemoRequest {
  key: string
  studio: string
  kiln: string
  /** Which firing of that kiln: the nth upcoming one (0 = next), or a past one made for the purpose. */
  firing: number | 'past'
  /** A past firing's cone and atmosphere (cone 6 oxidation with a slow cool when left out). */
  pastFiring?: { cone: string; atmosphere: Firing['atmosphere']; slowCool: boolean; notes: string }
  /** Paid by card (after start, through Stripe) rather than at the counter. */
  paidOnline?: boolean
  potter: string
  pieces: Piece[]
  notes: string
  state: RequestState
  /** Checked in piece by piece against the studio's checklist (every item passed), each piece tagged. */
  checkedInBy?: string
  acknowledged?: string[]
  /** Both sides' answers after pickup, published: the potter's about the studio, the studio's about the potter. */
  reviews?: {
    potter: Pick<Review, 'loading' | 'resultsAsLogged' | 'turnaround' | 'communication' | 'fireAgain' | 'note'>
    studio: Pick<Review, 'asDeclared' | 'cleanAndDry' | 'onTime' | 'note'>
  }
  /** A word from the studio in the thread after pickup. */
  thanks?: string
}

const DEMO_REQUESTS: DemoRequest[] = [
  {
    key: 'near-full',
    studio: 'Alder Street Clay Commons',
    kiln: 'Big Ten',
    firing: 0,
    potter: 'theo.marsh@demo.conewright.test',
    pieces: [VASES],
    notes: 'Tall forms: please keep them off the top shelf.',
    state: 'received',
    checkedInBy: 'dev.ramanathan@demo.conewright.test',
  },
  {
    key: 'mugs-paid',
    studio: 'Alder Street Clay Commons',
    kiln: 'Big Ten',
    firing: 0,
    potter: 'wren.alvarado@demo.conewright.test',
    pieces: [MUGS],
    notes: 'Could these go in the slow-cool part of the load?',
    state: 'received',
    checkedInBy: 'dev.ramanathan@demo.conewright.test',
  },
  {
    key: 'bowls-paid',
    studio: 'Alder Street Clay Commons',
    kiln: 'Big Ten',
    firing: 1,
    potter: 'wren.alvarado@demo.conewright.test',
    pieces: [{ ...MUGS, label: 'Soup bowls', quantity: 4, heightMm: 80, widthMm: 150, depthMm: 150, round: true }],
    notes: '',
    state: 'deposit_paid',
  },
  {
    key: 'celadon-waiting',
    studio: 'Fernhollow Gas Works',
    kiln: 'The Car',
    firing: 0,
    potter: 'wren.alvarado@demo.conewright.test',
    pieces: [CELADON_BOWLS],
    notes: 'A runny celadon; each bowl sits on its own cookie.',
    state: 'sent',
    acknowledged: [],
  },
  {
    key: 'mugs-waiting',
    studio: 'Alder Street Clay Commons',
    kiln: 'Big Ten',
    firing: 1,
    potter: 'theo.marsh@demo.conewright.test',
    pieces: [MUGS],
    notes: '',
    state: 'sent',
  },
  {
    key: 'plates-draft',
    studio: 'Mudlark Clay Supply',
    kiln: 'Bisque Bay',
    firing: 0,
    potter: 'wren.alvarado@demo.conewright.test',
    pieces: [GREEN_PLATES],
    notes: 'Dried under plastic for a week.',
    state: 'draft',
  },
  {
    key: 'past-collected',
    studio: 'Alder Street Clay Commons',
    kiln: 'Big Ten',
    firing: 'past',
    potter: 'wren.alvarado@demo.conewright.test',
    pieces: [MUGS],
    notes: 'Matte glazes; slow cool if you can.',
    state: 'collected',
    paidOnline: true,
    reviews: {
      potter: {
        loading: 'yes',
        resultsAsLogged: 'yes',
        turnaround: 'partly',
        communication: 'yes',
        fireAgain: true,
        note: 'Marisol slow-cooled the load as promised; the matte glazes came out buttery. Ready a day later than the date given.',
      },
      studio: { asDeclared: 'yes', cleanAndDry: 'yes', onTime: 'yes', note: 'Feet wiped clean, all six as declared.' },
    },
    thanks: 'Thank you, Wren. See you at the next cone 6.',
  },
  {
    // Its firing has the demo's incident (server/db/demo-incidents.ts): a jar burst early in the climb.
    key: 'past-blowout',
    studio: 'Alder Street Clay Commons',
    kiln: 'Big Ten',
    firing: 'past',
    pastFiring: { cone: '6', atmosphere: 'oxidation', slowCool: true, notes: 'Full load; the controller ran its fast program by mistake.' },
    potter: 'theo.marsh@demo.conewright.test',
    pieces: [
      { ...MUGS, label: 'Thick-walled jars', quantity: 2, heightMm: 160, widthMm: 120, depthMm: 120, round: true, wallThicknessMm: 14 },
    ],
    notes: 'Made last week; they felt dry to me.',
    state: 'collected',
    checkedInBy: 'marisol.okafor@demo.conewright.test',
  },
  {
    key: 'celadon-collected',
    studio: 'Fernhollow Gas Works',
    kiln: 'The Car',
    firing: 'past',
    pastFiring: { cone: '10', atmosphere: 'reduction', slowCool: false, notes: 'Heavy reduction from cone 6; cooled over 36 hours.' },
    potter: 'theo.marsh@demo.conewright.test',
    pieces: [CELADON_BOWLS],
    notes: 'Celadon bowls, each on its own cookie.',
    state: 'collected',
    paidOnline: true,
  },
]

/** The demo requests paid by card, by key: demo-payouts.ts makes their payments through Stripe. */
export const DEMO_PAID_ONLINE = DEMO_REQUESTS.filter((d) => d.paidOnline).map((d) => d.key)

/** The path a demo request walks to reach its state. */
const PATH: Record<string, RequestState[]> = {
  draft: ['draft'],
  sent: ['draft', 'sent'],
  deposit_paid: ['draft', 'sent', 'accepted', 'deposit_paid'],
  received: ['draft', 'sent', 'accepted', 'deposit_paid', 'received'],
  collected: ['draft', 'sent', 'accepted', 'deposit_paid', 'received', 'fired', 'ready', 'collected'],
}

export async function seedDemoRequests(manager: EntityManager, userIdOf: (email: string) => Promise<string>) {
  for (const demo of DEMO_REQUESTS) {
    const seeded: unknown[] = await manager.query(`SELECT 1 FROM request_events WHERE data->>'demoKey' = $1 LIMIT 1`, [demo.key])
    if (seeded.length) continue
    const studio = await manager.getRepository(Studio).findOneBy({ name: demo.studio })
    const kiln = studio && (await manager.getRepository(Kiln).findOneBy({ studioId: studio.id, name: demo.kiln }))
    if (!kiln || !studio) continue
    let firing: Firing | null
    if (demo.firing === 'past') {
      const fired = new Date(Date.now() - 16 * 86400_000)
      firing = await manager.getRepository(Firing).save(
        manager.getRepository(Firing).create({
          kilnId: kiln.id,
          kind: 'glaze',
          cone: demo.pastFiring?.cone ?? '6',
          atmosphere: demo.pastFiring?.atmosphere ?? 'oxidation',
          slowCool: demo.pastFiring?.slowCool ?? true,
          dropOffBy: new Date(fired.getTime() - 2 * 86400_000),
          firingDate: fired,
          readyBy: new Date(fired.getTime() + 3 * 86400_000),
          layersOnSale: null,
          status: 'unloaded',
          schedule: null,
          notes: demo.pastFiring?.notes ?? 'Slow cool through 1900 °F.',
          seriesId: null,
          cancelledReason: null,
        }),
      )
    } else {
      const upcoming = await manager
        .getRepository(Firing)
        .createQueryBuilder('f')
        .where('f.kiln_id = :kilnId', { kilnId: kiln.id })
        .andWhere(`f.status = 'open'`)
        .andWhere('f.drop_off_by > now()')
        .orderBy('f.firing_date', 'ASC')
        .getMany()
      firing = upcoming[demo.firing] ?? null
    }
    if (!firing) continue
    const potterId = await userIdOf(demo.potter)
    const { check, quote, volumeL } = await checkAgainstFiring(manager, firing, demo.pieces)
    const request = await manager.getRepository(FiringRequest).save({
      firingId: firing.id,
      potterId,
      state: demo.state,
      pieces: demo.pieces,
      notes: demo.notes,
      volumeL,
      verdict: check.verdict,
      findings: check.findings,
      acknowledgedWarnings: check.findings.filter((f) => f.severity === 'warn').map((f) => f.code),
      quote,
      standingQuote: demo.state === 'draft' ? null : quote,
      pendingQuote: null,
      // The deposit was asked when the studio took the request on.
      depositAskedCents: quote && PATH[demo.state].includes('accepted') ? quote.depositCents : null,
      policiesVersion: demo.state === 'draft' ? null : studio.policiesVersion,
      depositDueAt: null,
      proposedFiringId: null,
      sentAt: demo.state === 'draft' ? null : new Date(),
    })
    const path = PATH[demo.state]
    for (let i = 0; i < path.length; i++) {
      const actor = ['sent', 'draft'].includes(path[i]) ? potterId : null
      await manager.getRepository(RequestEvent).save({
        requestId: request.id,
        actorId: actor,
        fromState: i ? path[i - 1] : null,
        toState: path[i],
        reason: '',
        data: i ? {} : { demoKey: demo.key },
      })
    }
    if (demo.checkedInBy) await checkInDemoWare(manager, request, studio, await userIdOf(demo.checkedInBy))
    const currency = quote?.currency ?? 'USD'
    if (!demo.paidOnline && path.includes('deposit_paid') && quote && quote.depositCents > 0) {
      await manager.getRepository(LedgerEntry).save({
        requestId: request.id,
        direction: 'in',
        kind: 'counter',
        amountCents: quote.depositCents,
        currency,
        stripeSessionId: null,
        stripePaymentIntentId: null,
        stripeRefundId: null,
        note: 'Deposit paid at the counter',
      })
    }
    if (!demo.paidOnline && demo.state === 'collected' && quote) {
      const rest = quote.totalCents - quote.depositCents
      if (rest > 0)
        await manager.getRepository(LedgerEntry).save({
          requestId: request.id,
          direction: 'in',
          kind: 'counter',
          amountCents: rest,
          currency,
          stripeSessionId: null,
          stripePaymentIntentId: null,
          stripeRefundId: null,
          note: 'Balance paid at the counter',
        })
    }
    const studioOwnerId = (await manager.getRepository(StudioMember).findOneByOrFail({ studioId: studio.id, role: 'owner' })).userId
    if (demo.reviews) {
      const at = new Date()
      const closesAt = reviewWindowClosesAt(at)
      const none = { loading: null, resultsAsLogged: null, turnaround: null, communication: null, fireAgain: null }
      const noneOfStudio = { asDeclared: null, cleanAndDry: null, onTime: null }
      const common = { requestId: request.id, studioId: studio.id, potterId, closesAt, publishedAt: at }
      await manager.getRepository(Review).insert([
        { ...common, side: 'potter', authorId: potterId, ...noneOfStudio, ...demo.reviews.potter },
        { ...common, side: 'studio', authorId: studioOwnerId, ...none, ...demo.reviews.studio },
      ])
    }
    if (demo.thanks) {
      await manager
        .getRepository(RequestMessage)
        .insert({ requestId: request.id, authorId: studioOwnerId, side: 'studio', body: demo.thanks, notifiedAt: new Date() })
    }
  }
}

/** The ware as it came in: every piece tagged against the studio's checklist, every item passed. */
async function checkInDemoWare(manager: EntityManager, request: FiringRequest, studio: Studio, crewId: string) {
  for (const [pieceIndex, line] of request.pieces.entries()) {
    const checks = studio.dropOffChecklist
      .filter((item) => itemApplies(item, line))
      .map((item) => ({ id: item.id, label: item.label, passed: true }))
    for (let copy = 1; copy <= line.quantity; copy++) {
      await insertPiece(manager, {
        requestId: request.id,
        pieceIndex,
        copy,
        heightMm: line.heightMm,
        widthMm: line.widthMm,
        depthMm: line.round === true ? line.widthMm : line.depthMm,
        round: line.round === true,
        weightG: line.weightG ?? null,
        checks,
        status: 'in-load',
        holdReason: null,
        heldAt: null,
        outcome: null,
        outcomeNotes: '',
        outcomeAt: null,
        outcomeBy: null,
        checkedInBy: crewId,
      })
    }
  }
  await manager.getRepository(CheckIn).save({
    requestId: request.id,
    receivedPieces: request.pieces.map((line, pieceIndex) => ({ pieceIndex, declared: line.quantity, received: line.quantity })),
    conditionNotes: '',
    refused: false,
    refusedReason: null,
    quoteBefore: request.standingQuote,
    quoteAfter: request.standingQuote,
    priceConfirmedAt: new Date(),
    checkedInBy: crewId,
  })
}
