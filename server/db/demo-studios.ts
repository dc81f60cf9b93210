// The demo scenario: four invented studios around Portland, Oregon, with their people, kilns, price
// lists and a firing calendar that always reaches eight weeks ahead. Everything here is made up.
import { TZDate } from '@date-fns/tz'
import { addDays, startOfDay } from 'date-fns'
import type { EntityManager } from 'typeorm'
import type { PriceList } from '../../shared/firing/quote'
import type { KilnBody, StudioPolicies } from '../../shared/schemas/studios'
import { Firing } from '../entities/Firing'
import { Kiln } from '../entities/Kiln'
import { KilnPriceList } from '../entities/KilnPriceList'
import { Studio } from '../entities/Studio'
import { StudioMember } from '../entities/StudioMember'
import { lookupPlace } from '../services/gazetteer'
import { kilnColumns, priceListColumns } from '../services/kilns'
import type { DemoPerson } from './seed'

const inch = (n: number) => Math.round(n * 25.4)

/** A recurring firing: weekday (0 = Sunday) and hour in the studio's zone, every N weeks. */
interface FiringRule {
  kind: Firing['kind']
  cone: string
  atmosphere: Firing['atmosphere']
  weekday: number
  hour: number
  everyWeeks: number
  /** Drop-off closes this many days before, at 6 pm. */
  dropOffDaysBefore: number
  /** Ware is ready this many days after. */
  readyDaysAfter: number
  /** Layers on sale; every layer when not said. */
  layersOnSale?: number
  slowCool?: boolean
  notes?: string
}

interface DemoKiln {
  body: KilnBody
  priceList: PriceList
  firings: FiringRule[]
}

export interface DemoStudio {
  name: string
  description: string
  address: string
  dropOffHours: string
  policies: StudioPolicies
  owner: DemoPerson
  crew: DemoPerson[]
  kilns: DemoKiln[]
}

export const DEMO_STUDIOS: DemoStudio[] = [
  {
    name: 'Alder Street Clay Commons',
    description:
      'A members’ studio in a converted bakery with two electric kilns. We fire cone 6 oxidation glaze loads every Friday and bisque every other Tuesday, and sell spare shelf space to potters from outside the studio.',
    address: '2318 SE Alder St, Portland, OR 97214',
    dropOffHours: 'Tue–Sat 10 am – 7 pm',
    policies: {
      clayBodies: ['stoneware', 'porcelain', 'earthenware'],
      wareRequirements:
        'Bone dry or bisqued. Wax feet; no glaze within 1/4 in of the foot. Runny glazes on a cookie. Label the underside with your initials.',
      cancellation: { fullRefundDaysBefore: 5, laterRefundPercent: 50 },
      depositHoldHours: 48,
    },
    owner: { email: 'marisol.okafor@demo.conewright.test', displayName: 'Marisol Okafor', role: 'host' },
    crew: [{ email: 'dev.ramanathan@demo.conewright.test', displayName: 'Dev Ramanathan', role: 'crew' }],
    kilns: [
      {
        body: {
          name: 'Big Ten',
          kind: 'electric',
          atmospheres: ['oxidation'],
          interior: { shape: 'round', diameterMm: inch(28), heightMm: inch(27) },
          minCone: '022',
          maxCone: '10',
          maxTempC: 1300,
          maxRampCPerHour: 300,
          preheatHold: true,
          controlledCooling: true,
          shelfCount: 6,
          shelfWidthMm: inch(26),
          shelfDepthMm: inch(26),
          notes: 'Ten-sided top-loader with a digital controller and a downdraft vent.',
        },
        priceList: {
          currency: 'USD',
          model: 'volume',
          centsPerCubicInch: 4,
          minimumPerPieceCents: 300,
          surcharges: { slowCool: 15, preheat: 10 },
          deposit: { percent: 25 },
        },
        firings: [
          {
            kind: 'glaze',
            cone: '6',
            atmosphere: 'oxidation',
            weekday: 5,
            hour: 9,
            everyWeeks: 1,
            dropOffDaysBefore: 2,
            readyDaysAfter: 3,
            notes: 'Slow cool through 1900 °F when asked.',
          },
        ],
      },
      {
        body: {
          name: 'Little Blue',
          kind: 'electric',
          atmospheres: ['oxidation'],
          interior: { shape: 'round', diameterMm: inch(18), heightMm: inch(18) },
          minCone: '022',
          maxCone: '6',
          maxTempC: 1250,
          maxRampCPerHour: 250,
          preheatHold: true,
          controlledCooling: false,
          shelfCount: 4,
          shelfWidthMm: inch(17),
          shelfDepthMm: inch(17),
          notes: 'Small kiln for bisque and test tiles.',
        },
        priceList: { currency: 'USD', model: 'volume', centsPerCubicInch: 3, minimumPerPieceCents: 200, deposit: { percent: 25 } },
        firings: [
          {
            kind: 'bisque',
            cone: '04',
            atmosphere: 'oxidation',
            weekday: 2,
            hour: 8,
            everyWeeks: 2,
            dropOffDaysBefore: 1,
            readyDaysAfter: 2,
          },
        ],
      },
    ],
  },
  {
    name: 'Fernhollow Gas Works',
    description:
      'A 40 cubic foot gas car kiln behind a barn, fired to cone 10 in reduction every other Saturday. Shino, celadon and tenmoku people welcome. We candle greenware overnight on request.',
    address: '4410 NW Fernhollow Rd, Hillsboro, OR 97124',
    dropOffHours: 'Thu–Fri 4 – 8 pm, Sat 9 am – noon',
    policies: {
      clayBodies: ['stoneware', 'porcelain'],
      wareRequirements:
        'High-fire stoneware or porcelain only (cone 10). Bisqued ware; glaze cleaned 1/4 in from the foot. Shinos on a cookie.',
      cancellation: { fullRefundDaysBefore: 10, laterRefundPercent: 25 },
      depositHoldHours: 72,
    },
    owner: { email: 'gideon.achterberg@demo.conewright.test', displayName: 'Gideon Achterberg', role: 'host' },
    crew: [{ email: 'lupe.navarro@demo.conewright.test', displayName: 'Lupe Navarro', role: 'crew' }],
    kilns: [
      {
        body: {
          name: 'The Car',
          kind: 'gas',
          atmospheres: ['reduction', 'oxidation', 'neutral'],
          interior: { shape: 'box', widthMm: inch(40), depthMm: inch(36), heightMm: inch(42) },
          minCone: '010',
          maxCone: '12',
          maxTempC: 1340,
          maxRampCPerHour: 200,
          preheatHold: true,
          controlledCooling: true,
          shelfCount: 12,
          shelfWidthMm: inch(24),
          shelfDepthMm: inch(12),
          notes: 'Natural-gas car kiln with four venturi burners; body reduction at cone 010, heavy reduction from cone 6.',
        },
        priceList: {
          currency: 'USD',
          model: 'shelf',
          shelfCents: 4500,
          shelfStep: 0.25,
          minimumPerPieceCents: 400,
          surcharges: { reduction: 10, preheat: 10 },
          deposit: { fixedCents: 2000 },
        },
        firings: [
          {
            kind: 'glaze',
            cone: '10',
            atmosphere: 'reduction',
            weekday: 6,
            hour: 6,
            everyWeeks: 2,
            dropOffDaysBefore: 2,
            readyDaysAfter: 3,
            notes: 'Reduction from cone 010; cooled in about 36 hours.',
          },
        ],
      },
    ],
  },
  {
    name: 'Tumblebrook Wood & Soda',
    description:
      'A three-chamber-long anagama and a soda kiln in the hills above Banks. The wood kiln fires a few times a year for five days; the soda kiln about once a month. Expect ash, flashing and some risk.',
    address: '15250 NW Tumblebrook Ln, Banks, OR 97106',
    dropOffHours: 'By arrangement; weekends before a firing',
    policies: {
      clayBodies: ['stoneware', 'porcelain'],
      wareRequirements:
        'Cone 10–11 stoneware or porcelain, bisqued. Wadded feet (we supply wadding). No low-fire glazes. Pieces may fuse to their neighbours in the wood kiln: that risk is yours.',
      cancellation: { fullRefundDaysBefore: 21, laterRefundPercent: 0 },
      depositHoldHours: 96,
    },
    owner: { email: 'ines.halvorsen@demo.conewright.test', displayName: 'Ines Halvorsen', role: 'host' },
    crew: [{ email: 'wynn.tafoya@demo.conewright.test', displayName: 'Wynn Tafoya', role: 'crew' }],
    kilns: [
      {
        body: {
          name: 'Long Dragon',
          kind: 'wood',
          atmospheres: ['reduction', 'neutral'],
          interior: { shape: 'box', widthMm: inch(54), depthMm: inch(160), heightMm: inch(60) },
          minCone: '8',
          maxCone: '13',
          maxTempC: 1360,
          maxRampCPerHour: 90,
          preheatHold: true,
          controlledCooling: false,
          shelfCount: 96,
          shelfWidthMm: inch(24),
          shelfDepthMm: inch(12),
          notes: 'Five-day firings. Side-stoking from day three.',
        },
        priceList: { currency: 'USD', model: 'volume', centsPerLitre: 160, minimumPerPieceCents: 800, deposit: { percent: 50 } },
        firings: [
          {
            kind: 'glaze',
            cone: '11',
            atmosphere: 'reduction',
            weekday: 4,
            hour: 7,
            everyWeeks: 6,
            dropOffDaysBefore: 5,
            readyDaysAfter: 10,
            notes: 'Loading takes two days; ware placed by the crew.',
          },
        ],
      },
      {
        body: {
          name: 'Soda Box',
          kind: 'soda',
          atmospheres: ['reduction', 'neutral'],
          interior: { shape: 'box', widthMm: inch(36), depthMm: inch(36), heightMm: inch(40) },
          minCone: '6',
          maxCone: '11',
          maxTempC: 1330,
          maxRampCPerHour: 150,
          preheatHold: true,
          controlledCooling: false,
          shelfCount: 6,
          shelfWidthMm: inch(18),
          shelfDepthMm: inch(18),
          notes: 'Soda ash sprayed from cone 8. Shelves are kiln-washed; bring wadding.',
        },
        priceList: {
          currency: 'USD',
          model: 'volume',
          centsPerLitre: 130,
          minimumPerPieceCents: 600,
          surcharges: { reduction: 0 },
          deposit: { percent: 40 },
        },
        firings: [
          {
            kind: 'glaze',
            cone: '10',
            atmosphere: 'reduction',
            weekday: 6,
            hour: 7,
            everyWeeks: 4,
            dropOffDaysBefore: 3,
            readyDaysAfter: 4,
          },
        ],
      },
    ],
  },
  {
    name: 'Mudlark Clay Supply',
    description:
      'A clay and glaze shop with a bisque service: bring your bone-dry greenware by Sunday evening and collect it Wednesday, ready to glaze. We candle every load.',
    address: '10815 SE Main St, Milwaukie, OR 97222',
    dropOffHours: 'Mon–Sat 9 am – 6 pm, Sun noon – 5 pm',
    policies: {
      clayBodies: ['earthenware', 'stoneware', 'porcelain', 'other'],
      wareRequirements:
        'Bone dry greenware only: it must no longer feel cool against your cheek (cool means water is still in it). Walls over 3/4 in get an extra candling charge. No glaze on anything.',
      cancellation: { fullRefundDaysBefore: 1, laterRefundPercent: 0 },
      depositHoldHours: 24,
    },
    owner: { email: 'orrin.castellanos@demo.conewright.test', displayName: 'Orrin Castellanos', role: 'host' },
    crew: [{ email: 'bea.whitlock@demo.conewright.test', displayName: 'Bea Whitlock', role: 'crew' }],
    kilns: [
      {
        body: {
          name: 'Bisque Bay',
          kind: 'electric',
          atmospheres: ['oxidation'],
          interior: { shape: 'round', diameterMm: inch(29), heightMm: inch(36) },
          minCone: '022',
          maxCone: '8',
          maxTempC: 1280,
          maxRampCPerHour: 330,
          preheatHold: true,
          controlledCooling: false,
          shelfCount: 8,
          shelfWidthMm: inch(27),
          shelfDepthMm: inch(27),
          notes: 'Bisque only. Every load candles 8 hours at 180 °F.',
        },
        priceList: {
          currency: 'USD',
          model: 'shelf',
          shelfCents: 1800,
          shelfStep: 0.5,
          minimumPerPieceCents: 150,
          surcharges: { preheat: 0 },
          deposit: { percent: 20 },
        },
        firings: [
          {
            kind: 'bisque',
            cone: '04',
            atmosphere: 'oxidation',
            weekday: 1,
            hour: 8,
            everyWeeks: 1,
            dropOffDaysBefore: 1,
            readyDaysAfter: 2,
          },
        ],
      },
    ],
  },
]

/** How far ahead the demo calendar reaches. */
export const DEMO_WEEKS_AHEAD = 8

/** The occurrences of a rule from today to `weeks` ahead, in the studio's zone. */
export function occurrences(rule: FiringRule, timezone: string, now: Date, weeks: number) {
  const today = startOfDay(new TZDate(now, timezone))
  // Series are anchored on a fixed Monday so every-other-week rules land on the same weeks each run.
  const anchor = new TZDate(2026, 0, 5, 0, 0, 0, timezone)
  const result: { dropOffBy: Date; firingDate: Date; readyBy: Date }[] = []
  for (let day = 0; day < weeks * 7; day++) {
    const date = addDays(today, day)
    if (date.getDay() !== rule.weekday) continue
    const weeksSinceAnchor = Math.round((startOfDay(date).getTime() - anchor.getTime()) / (7 * 24 * 3600_000))
    if (weeksSinceAnchor % rule.everyWeeks !== 0) continue
    const firing = new TZDate(date.getFullYear(), date.getMonth(), date.getDate(), rule.hour, 0, 0, timezone)
    const dropDay = addDays(firing, -rule.dropOffDaysBefore)
    const dropOffBy = new TZDate(dropDay.getFullYear(), dropDay.getMonth(), dropDay.getDate(), 18, 0, 0, timezone)
    const readyDay = addDays(firing, rule.readyDaysAfter)
    const readyBy = new TZDate(readyDay.getFullYear(), readyDay.getMonth(), readyDay.getDate(), 12, 0, 0, timezone)
    if (dropOffBy.getTime() < now.getTime()) continue
    result.push({ dropOffBy: new Date(dropOffBy.getTime()), firingDate: new Date(firing.getTime()), readyBy: new Date(readyBy.getTime()) })
  }
  return result
}

/**
 * Creates the demo studios (once, found again by name) and tops their calendars up to eight weeks
 * ahead; a firing already on a kiln at the same time is not added twice.
 */
export async function seedDemoStudios(
  manager: EntityManager,
  studios: DemoStudio[],
  userFor: (person: DemoPerson) => Promise<{ id: string }>,
  now = new Date(),
) {
  for (const demo of studios) {
    const owner = await userFor(demo.owner)
    let studio = await manager.getRepository(Studio).findOne({ where: { name: demo.name } })
    if (!studio) {
      const place = lookupPlace(demo.address)
      if (!place) throw new Error(`demo address not in the gazetteer: ${demo.address}`)
      studio = await manager.getRepository(Studio).save(
        manager.getRepository(Studio).create({
          name: demo.name,
          description: demo.description,
          addressLine: demo.address,
          postalCode: place.postalCode,
          city: place.city,
          region: place.region,
          country: place.country,
          lat: place.lat,
          lng: place.lng,
          timezone: place.timezone,
          currency: 'USD',
          dropOffHours: demo.dropOffHours,
          policies: demo.policies,
          published: true,
          verifiedAt: new Date(),
        }),
      )
      await manager.getRepository(StudioMember).save({ studioId: studio.id, userId: owner.id, role: 'owner' })
      for (const person of demo.crew) {
        const crew = await userFor(person)
        await manager.getRepository(StudioMember).save({ studioId: studio.id, userId: crew.id, role: 'crew' })
      }
    }
    for (const demoKiln of demo.kilns) {
      let kiln = await manager.getRepository(Kiln).findOne({ where: { studioId: studio.id, name: demoKiln.body.name } })
      if (!kiln) {
        kiln = await manager
          .getRepository(Kiln)
          .save(manager.getRepository(Kiln).create({ ...kilnColumns(demoKiln.body), studioId: studio.id, retiredAt: null }))
        await manager.getRepository(KilnPriceList).save({ kilnId: kiln.id, ...priceListColumns(demoKiln.priceList) })
      }
      for (const rule of demoKiln.firings) {
        for (const when of occurrences(rule, studio.timezone, now, DEMO_WEEKS_AHEAD)) {
          const exists = await manager.getRepository(Firing).exists({ where: { kilnId: kiln.id, firingDate: when.firingDate } })
          if (exists) continue
          await manager.getRepository(Firing).save(
            manager.getRepository(Firing).create({
              kilnId: kiln.id,
              kind: rule.kind,
              cone: rule.cone,
              atmosphere: rule.atmosphere,
              slowCool: rule.slowCool ?? false,
              ...when,
              layersOnSale: rule.layersOnSale ?? null,
              status: 'open',
              schedule: null,
              notes: rule.notes ?? '',
              seriesId: null,
              cancelledReason: null,
            }),
          )
        }
      }
    }
  }
}
