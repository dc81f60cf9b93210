// More invented studios around the Portland region, so the map has something to show: built from
// word lists by a fixed recipe, the same every run. Towns and ZIP codes are real places; the
// studios, people and kilns are made up.
import type { KilnBody } from '../../shared/schemas/studios'
import type { DemoStudio } from './demo-studios'

const TOWNS: [string, string][] = [
  ['Vancouver, WA', '98660'],
  ['Beaverton, OR', '97005'],
  ['Gresham, OR', '97030'],
  ['Lake Oswego, OR', '97034'],
  ['Oregon City, OR', '97045'],
  ['Tigard, OR', '97223'],
  ['Tualatin, OR', '97062'],
  ['West Linn, OR', '97068'],
  ['Forest Grove, OR', '97116'],
  ['McMinnville, OR', '97128'],
  ['Newberg, OR', '97132'],
  ['Salem, OR', '97301'],
  ['Silverton, OR', '97381'],
  ['Canby, OR', '97013'],
  ['Sandy, OR', '97055'],
  ['Troutdale, OR', '97060'],
  ['Camas, WA', '98607'],
  ['Battle Ground, WA', '98604'],
  ['Ridgefield, WA', '98642'],
  ['St. Helens, OR', '97051'],
  ['Scappoose, OR', '97056'],
  ['Hood River, OR', '97031'],
  ['The Dalles, OR', '97058'],
  ['Astoria, OR', '97103'],
  ['Seaside, OR', '97138'],
  ['Tillamook, OR', '97141'],
  ['Corvallis, OR', '97330'],
  ['Albany, OR', '97321'],
  ['Woodburn, OR', '97071'],
  ['Molalla, OR', '97038'],
  ['Estacada, OR', '97023'],
  ['Wilsonville, OR', '97070'],
  ['Sherwood, OR', '97140'],
  ['Longview, WA', '98632'],
  ['Washougal, WA', '98671'],
  ['Portland, OR', '97217'],
]

const NAME_FIRST = [
  'Cedar',
  'Heron',
  'Basalt',
  'Rain Shadow',
  'Mossy Rock',
  'Slipstream',
  'Alder Bend',
  'Quarry',
  'Tidewater',
  'Foxglove',
  'Ember',
  'Riverstone',
  'Juniper',
  'Salt Marsh',
  'Copper Fern',
  'Wild Rye',
  'Ash Hollow',
  'Blue Heron',
]
const NAME_LAST = ['Clay Studio', 'Kiln Share', 'Pottery', 'Ceramics Co-op', 'Fire Works', 'Clay Collective', 'Kiln House', 'Pot Shop']
const PEOPLE_FIRST = [
  'Juno',
  'Arlo',
  'Maren',
  'Tobias',
  'Priya',
  'Soren',
  'Beatrix',
  'Kenji',
  'Odette',
  'Rafael',
  'Linnea',
  'Caspian',
  'Noor',
  'Silas',
  'Ingrid',
  'Mateo',
  'Wilhelmina',
  'Ezra',
]
const PEOPLE_LAST = [
  'Feld',
  'Okonkwo',
  'Vasquez-Lind',
  'Aberdeen',
  'Hollis',
  'Marchetti',
  'Sundqvist',
  'Tran',
  'Delacroix-Moe',
  'Brightwater',
  'Kowalczyk',
  'Ferreira',
]

const inch = (n: number) => Math.round(n * 25.4)

function electric(name: string, diameterIn: number, heightIn: number, maxCone: string): KilnBody {
  return {
    name,
    kind: 'electric',
    atmospheres: ['oxidation'],
    interior: { shape: 'round', diameterMm: inch(diameterIn), heightMm: inch(heightIn) },
    minCone: '022',
    maxCone,
    maxTempC: maxCone === '10' ? 1300 : 1260,
    maxRampCPerHour: 280,
    preheatHold: true,
    controlledCooling: true,
    shelfCount: 5,
    notes: '',
  }
}

function gas(name: string, widthIn: number, depthIn: number, heightIn: number): KilnBody {
  return {
    name,
    kind: 'gas',
    atmospheres: ['reduction', 'oxidation'],
    interior: { shape: 'box', widthMm: inch(widthIn), depthMm: inch(depthIn), heightMm: inch(heightIn) },
    minCone: '010',
    maxCone: '11',
    maxTempC: 1330,
    maxRampCPerHour: 180,
    preheatHold: true,
    controlledCooling: false,
    shelfCount: 6,
    notes: '',
  }
}

/** Thirty-six more studios, one per town, with varied kilns, prices and calendars. */
export function regionalDemoStudios(): DemoStudio[] {
  return TOWNS.map(([town, zip], i) => {
    const name = `${NAME_FIRST[i % NAME_FIRST.length]} ${NAME_LAST[(i * 5) % NAME_LAST.length]}`
    const first = PEOPLE_FIRST[(i * 7) % PEOPLE_FIRST.length]
    const last = PEOPLE_LAST[(i * 3) % PEOPLE_LAST.length]
    const slug = name.toLowerCase().replace(/[^a-z]+/g, '-')
    const gasKiln = i % 3 === 0
    const small = i % 4 === 1
    const body = gasKiln
      ? gas('Car kiln', 30 + (i % 3) * 6, 30, 36 + (i % 2) * 6)
      : electric(small ? 'Test kiln' : 'Top-loader', small ? 18 : 23 + (i % 4) * 2, small ? 18 : 27, i % 2 ? '6' : '10')
    const cone = gasKiln ? '10' : body.maxCone === '6' ? '6' : i % 5 === 0 ? '10' : '6'
    return {
      name,
      description: `${gasKiln ? 'A gas kiln' : 'An electric kiln'} in ${town.split(',')[0]}, with shelf space for outside potters.`,
      address: `${town} ${zip}`,
      dropOffHours: i % 2 ? 'Weekdays 9 am – 5 pm' : 'Thu–Sun noon – 6 pm',
      policies: {
        clayBodies: gasKiln ? ['stoneware', 'porcelain'] : ['stoneware', 'porcelain', 'earthenware'],
        wareRequirements: 'Bone dry or bisqued; glaze off the foot; runny glazes on a cookie.',
        cancellation: { fullRefundDaysBefore: 3 + (i % 5), laterRefundPercent: (i % 3) * 25 },
        depositHoldHours: 48,
      },
      owner: { email: `owner.${slug}@demo.conewright.test`, displayName: `${first} ${last}`, role: 'host' },
      crew: [],
      kilns: [
        {
          body,
          priceList:
            i % 2
              ? { currency: 'USD', model: 'volume', centsPerCubicInch: 3 + (i % 4), minimumPerPieceCents: 250, deposit: { percent: 25 } }
              : {
                  currency: 'USD',
                  model: 'shelf',
                  shelfCents: 2500 + (i % 5) * 500,
                  shelfStep: 0.25,
                  minimumPerPieceCents: 300,
                  surcharges: { reduction: gasKiln ? 10 : 0 },
                  deposit: { percent: 30 },
                },
          firings: [
            {
              kind: 'glaze',
              cone,
              atmosphere: gasKiln ? 'reduction' : 'oxidation',
              weekday: (i % 5) + 1,
              hour: 9,
              everyWeeks: 1 + (i % 3),
              dropOffDaysBefore: 2,
              readyDaysAfter: 3,
            },
            ...(i % 4 === 2
              ? [
                  {
                    kind: 'bisque' as const,
                    cone: '04',
                    atmosphere: 'oxidation' as const,
                    weekday: 0,
                    hour: 10,
                    everyWeeks: 2,
                    dropOffDaysBefore: 1,
                    readyDaysAfter: 2,
                  },
                ]
              : []),
          ],
        },
      ],
    }
  })
}
