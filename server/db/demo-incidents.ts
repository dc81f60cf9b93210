// The demo's incident: in a past firing at the community studio one of Theo's thick-walled jars burst
// early in the climb (the controller ran a fast program), showering the shelf. Marisol reported it
// with a photo, the log shows the fast climb through water smoking, and she claimed the cleaning fee
// under the studio's terms; the claim is paid by card with the demo's other payments (demo-payouts.ts).
// Everything goes through the same services the app uses. Running it again changes nothing.
import sharp from 'sharp'
import type { AppContext } from '../context'
import { Claim } from '../entities/Claim'
import { FiringLog } from '../entities/FiringLog'
import { Incident } from '../entities/Incident'
import { User } from '../entities/User'
import { WarePiece } from '../entities/WarePiece'
import { raiseClaim } from '../services/claims'
import { addIncidentPhotos, reportIncident } from '../services/incidents'
import { loadRequest } from '../services/request-context'

export const DEMO_INCIDENT_REQUEST = 'past-blowout'
const REPORTER = 'marisol.okafor@demo.conewright.test'

/** The controller's fast program: 20 → 200 °C in half an hour, then a steady climb to cone 6 and a slow cool. */
function fastStartReadings(start: Date) {
  const points: [minute: number, tempC: number][] = [[0, 20]]
  const to = (tempC: number, rateCPerHour: number) => {
    const [minute, from] = points[points.length - 1]
    points.push([minute + (Math.abs(tempC - from) / rateCPerHour) * 60, tempC])
  }
  to(200, 360)
  to(1100, 100)
  to(1185, 60)
  points.push([points[points.length - 1][0] + 10, 1185])
  to(30, 40)
  return points.map(([minute, tempC]) => ({ at: new Date(start.getTime() + minute * 60_000).toISOString(), tempC }))
}

/** A drawing of a kiln shelf with the burst jar's shards, as the demo's photo. */
async function shelfPhoto(): Promise<Buffer> {
  const shards = Array.from({ length: 14 }, (_, n) => {
    const x = 90 + ((n * 97) % 460)
    const y = 190 + ((n * 53) % 120)
    return `<polygon points="${x},${y} ${x + 26},${y + 8} ${x + 10},${y + 24}" fill="#b4704a" stroke="#5a3322" stroke-width="2"/>`
  }).join('')
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="640" height="420">
    <rect width="640" height="420" fill="#3b3431"/>
    <rect x="40" y="160" width="560" height="180" rx="6" fill="#d9d2c5"/>
    <ellipse cx="470" cy="200" rx="44" ry="18" fill="#8e9a7c"/>
    ${shards}
  </svg>`
  return sharp(Buffer.from(svg)).jpeg({ quality: 85 }).toBuffer()
}

export async function seedDemoIncident(ctx: AppContext) {
  const manager = ctx.db.manager
  const rows: { request_id: string }[] = await manager.query(`SELECT request_id FROM request_events WHERE data->>'demoKey' = $1 LIMIT 1`, [
    DEMO_INCIDENT_REQUEST,
  ])
  const requestId = rows[0]?.request_id
  if (!requestId) return
  if (await manager.getRepository(Incident).exists({ where: { requestId } })) return
  const rc = await loadRequest(manager, requestId)
  const reporter = await manager.getRepository(User).findOneByOrFail({ email: REPORTER })
  const readings = fastStartReadings(rc.firing.firingDate)
  await manager.getRepository(FiringLog).save({
    firingId: rc.firing.id,
    loadedAt: new Date(rc.firing.firingDate.getTime() - 2 * 3600_000),
    startedAt: rc.firing.firingDate,
    peakC: 1185,
    finalRateCPerHour: 60,
    holdMinutes: 10,
    offAt: new Date(Date.parse(readings[readings.length - 2].at)),
    openedAt: new Date(Date.parse(readings[readings.length - 1].at)),
    witnessCones: [{ cone: '6', bend: 'three-oclock', position: 'Middle' }],
    readings,
    notes: 'The controller ran the fast program for the first half hour.',
    updatedBy: reporter.id,
  })
  const jar = await manager.getRepository(WarePiece).findOneOrFail({ where: { requestId }, order: { copy: 'ASC' } })
  const incident = await reportIncident(ctx, reporter, rc.firing.id, {
    kind: 'blowout',
    shards: true,
    neighboursHit: false,
    shelfDamage: false,
    elementDamage: false,
    whereInKiln: 'Middle shelf, left',
    note: 'One jar burst early in the climb; shards across the middle shelf, none in the elements.',
    pieceTags: [jar.tag],
    hurtTags: [],
  })
  // Reported the morning the kiln was opened, not on the day the demo was seeded.
  const openedAt = Date.parse(readings[readings.length - 1].at)
  await manager.query(`UPDATE incidents SET created_at = $2 WHERE id = $1`, [incident.id, new Date(openedAt + 3600_000)])
  await addIncidentPhotos(ctx, reporter, incident.id, [{ originalname: 'middle-shelf.jpg', buffer: await shelfPhoto(), size: 0 }])
  await raiseClaim(ctx, reporter, incident.id, {
    chargeKind: 'kiln-cleaning',
    amountCents: 4500,
    note: 'An hour vacuuming shards from the shelf and the kiln floor, as our terms say.',
  })
}

/** The demo's claims still to pay: paid by card with the demo's other payments. */
export async function demoClaimsToPay(ctx: AppContext): Promise<Claim[]> {
  return ctx.db
    .getRepository(Claim)
    .createQueryBuilder('c')
    .innerJoin('request_events', 'e', `e.request_id = c.request_id AND e.data->>'demoKey' = :key`, { key: DEMO_INCIDENT_REQUEST })
    .where(`c.status = 'raised'`)
    .getMany()
}
