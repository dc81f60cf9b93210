import { describe, expect, it } from 'vitest'
import type { LoadRoom } from '../../../shared/firing/load'
import {
  checkWare,
  pieceFitsFootprint,
  pieceVolumeL,
  requestVolumeL,
  usableHeightMm,
  verdictOf,
  type Finding,
  type FindingCode,
  type Firing,
  type Kiln,
  type Piece,
} from '../../../shared/firing/check'
import { inToMm } from '../../../shared/firing/units'
import { bisqueFiring, electricKiln, glazeFiring, greenBowl, mug } from './fixtures'

function findings(kiln: Kiln, firing: Firing, pieces: Piece[], code: FindingCode): Finding[] {
  return checkWare(kiln, firing, pieces).findings.filter((finding) => finding.code === code)
}

function expectOne(kiln: Kiln, firing: Firing, pieces: Piece[], code: FindingCode, severity: Finding['severity']): Finding {
  const found = findings(kiln, firing, pieces, code)
  expect(found).toHaveLength(1)
  expect(found[0].severity).toBe(severity)
  expect(found[0].message.length).toBeGreaterThan(20)
  return found[0]
}

function expectNone(kiln: Kiln, firing: Firing, pieces: Piece[], code: FindingCode) {
  expect(findings(kiln, firing, pieces, code)).toEqual([])
}

describe('the passing loads', () => {
  it('finds nothing wrong with glazed mugs in a cone 6 glaze firing', () => {
    const check = checkWare(electricKiln(), glazeFiring(), [mug(), mug({ quantity: 6 })])
    expect(check.findings).toEqual([])
    expect(check.verdict).toBe('ok')
    expect(check.schedule.predictedCone).toBe('6')
  })

  it('finds nothing wrong with bone-dry greenware in a cone 04 bisque', () => {
    // A bisque below the clay's maturity is normal: no clay-underfire.
    const check = checkWare(electricKiln(), bisqueFiring(), [greenBowl()])
    expect(check.findings).toEqual([])
    expect(check.verdict).toBe('ok')
  })
})

describe('kiln-cone-range', () => {
  it('blocks a cone outside the kiln’s range', () => {
    const finding = expectOne(electricKiln({ maxCone: '5' }), glazeFiring(), [mug()], 'kiln-cone-range', 'block')
    expect(finding.message).toContain('cone 6')
    expectOne(electricKiln({ minCone: '8' }), glazeFiring(), [mug()], 'kiln-cone-range', 'block')
  })

  it('passes a cone at either end of the range', () => {
    expectNone(electricKiln({ maxCone: '6' }), glazeFiring(), [mug()], 'kiln-cone-range')
    expectNone(electricKiln({ minCone: '6' }), glazeFiring(), [mug()], 'kiln-cone-range')
  })
})

describe('kiln-max-temp', () => {
  // Chart: cone 6 bends at 1222 °C at 60 °C/h, the planned final rate.
  it('blocks when the cone needs more heat than the kiln is rated for', () => {
    expectOne(electricKiln({ maxTempC: 1220 }), glazeFiring(), [mug()], 'kiln-max-temp', 'block')
  })

  it('passes at the cone’s temperature', () => {
    expectNone(electricKiln({ maxTempC: 1222 }), glazeFiring(), [mug()], 'kiln-max-temp')
  })

  it('uses the kiln’s own final rate: a slow kiln reaches cone 6 cooler', () => {
    // Chart: 1185 °C at 15 °C/h; at 40 °C/h the bend comes between 1185 and 1222.
    expectNone(electricKiln({ maxTempC: 1215, maxRampCPerHour: 40 }), glazeFiring(), [mug()], 'kiln-max-temp')
  })
})

describe('atmosphere-unavailable', () => {
  it('blocks reduction in an electric kiln that only oxidises', () => {
    expectOne(electricKiln(), glazeFiring({ atmosphere: 'reduction' }), [mug()], 'atmosphere-unavailable', 'block')
  })

  it('passes an atmosphere the kiln lists', () => {
    const gas = electricKiln({ kind: 'gas', atmospheres: ['oxidation', 'reduction'] })
    expectNone(gas, glazeFiring({ atmosphere: 'reduction' }), [mug()], 'atmosphere-unavailable')
  })
})

describe('piece-too-tall', () => {
  it('uses the interior height less one shelf and clearance by default', () => {
    // Bottom posts, one shelf and lid clearance take about 65 mm of the chamber (from memory).
    expect(usableHeightMm(electricKiln())).toBe(690 - 65)
    expect(usableHeightMm(electricKiln({ usableHeightMm: 500 }))).toBe(500)
  })

  it('blocks a piece taller than the usable height, naming the piece', () => {
    const kiln = electricKiln({ usableHeightMm: 300 })
    const finding = expectOne(kiln, glazeFiring(), [mug(), mug({ label: 'Vase', heightMm: 301 })], 'piece-too-tall', 'block')
    expect(finding.pieceIndex).toBe(1)
    expect(finding.message).toContain('Vase')
  })

  it('passes a piece exactly the usable height', () => {
    expectNone(electricKiln({ usableHeightMm: 300 }), glazeFiring(), [mug({ heightMm: 300 })], 'piece-too-tall')
  })
})

describe('piece-too-wide', () => {
  const round = electricKiln()

  // Shelves are about 50 mm smaller than the chamber (from memory): a 580 mm kiln takes a 530 mm shelf.
  it('fits a round piece by its diameter on a round shelf', () => {
    expectNone(round, glazeFiring(), [mug({ widthMm: 530, depthMm: 530 })], 'piece-too-wide')
    expectOne(round, glazeFiring(), [mug({ widthMm: 531, depthMm: 531 })], 'piece-too-wide', 'block')
  })

  it('fits a rectangle on a round shelf only if its diagonal fits', () => {
    // 3-4-5 triangle: a 318 × 424 mm slab has a 530 mm diagonal.
    const slab = mug({ round: false, widthMm: 318, depthMm: 424 })
    expectNone(round, glazeFiring(), [slab], 'piece-too-wide')
    expect(pieceFitsFootprint(round, slab)).toBe(true)
    // Both sides under 530 mm, yet the 380 × 380 square's diagonal (537.4 mm) does not fit.
    const square = mug({ round: false, widthMm: 380, depthMm: 380 })
    expectOne(round, glazeFiring(), [square], 'piece-too-wide', 'block')
  })

  it('fits a rectangle in a box kiln in either orientation', () => {
    // Box 500 × 350 mm inside: shelf 450 × 300 mm.
    const box = electricKiln({ interior: { shape: 'box', widthMm: 500, depthMm: 350, heightMm: 600 } })
    const platter = mug({ round: false, widthMm: 300, depthMm: 450 })
    expectNone(box, glazeFiring(), [platter], 'piece-too-wide')
    expectOne(box, glazeFiring(), [mug({ round: false, widthMm: 310, depthMm: 310 })], 'piece-too-wide', 'block')
    // A round piece in a box needs its diameter within the narrower side.
    expectNone(box, glazeFiring(), [mug({ widthMm: 300, depthMm: 300 })], 'piece-too-wide')
    expectOne(box, glazeFiring(), [mug({ widthMm: 301, depthMm: 301 })], 'piece-too-wide', 'block')
  })
})

describe('over-capacity', () => {
  // A 10 × 10 × 10 cm box is 1 L.
  const cube = mug({ round: false, heightMm: 100, widthMm: 100, depthMm: 100 })

  it('counts bounding-box litres, quantities included', () => {
    expect(pieceVolumeL(cube)).toBeCloseTo(1, 12)
    // A round piece's bounding box is its diameter squared times its height.
    expect(pieceVolumeL(mug({ heightMm: 100, widthMm: 100, depthMm: 1 }))).toBeCloseTo(1, 12)
    expect(requestVolumeL([cube, { ...cube, quantity: 4 }])).toBeCloseTo(5, 12)
    // 4 in cube = 64 in³ = 1.048772096 L (1 in = 25.4 mm exactly).
    const fourInches = inToMm(4)
    expect(pieceVolumeL(mug({ round: false, heightMm: fourInches, widthMm: fourInches, depthMm: fourInches }))).toBeCloseTo(1.048772096, 9)
  })

  // The load's room as the planner reports it: 0.5 shelf free for pieces up to 8 in, room up to 10 in tall.
  const room = (shelves: number, tallestMm = 254): LoadRoom => ({
    shelvesTotal: 6,
    shelvesTaken: 6 - shelves,
    shelvesLeft: shelves,
    tallestMm,
    layersUsed: 5,
    layersOnSale: 6,
    bands: [102, 203, 305, 457].map((upToMm) => ({ upToMm, shelves: upToMm <= tallestMm ? shelves : 0 })),
  })

  it('blocks a request that takes more shelves than the load has left for pieces that tall', () => {
    // Planned alone, 20 cubes fill more than half of the fixture kiln's 530 mm round shelf.
    const cubes = [{ ...cube, quantity: 20 }]
    expect(checkWare(electricKiln(), glazeFiring(), cubes).fit.shelvesNeeded).toBeGreaterThan(0.5)
    const finding = expectOne(electricKiln(), glazeFiring({ load: { room: room(0.5) } }), cubes, 'over-capacity', 'block')
    expect(finding.message).toMatch(/left for pieces this tall/)
  })

  it('blocks a piece taller than the load has room for, however few', () => {
    const finding = expectOne(
      electricKiln(),
      glazeFiring({ load: { room: room(3, 150) } }),
      [{ ...cube, heightMm: 200 }],
      'over-capacity',
      'block',
    )
    expect(finding.message).toMatch(/room for pieces up to 150 mm/)
  })

  it('takes the caller’s own planning when it says the pieces went in, and says nothing for a firing with no load', () => {
    expectNone(electricKiln(), glazeFiring({ load: { room: room(0), fits: true } }), [{ ...cube, quantity: 5 }], 'over-capacity')
    expectOne(electricKiln(), glazeFiring({ load: { room: room(6), fits: false } }), [cube], 'over-capacity', 'block')
    expectNone(electricKiln(), glazeFiring(), [{ ...cube, quantity: 500 }], 'over-capacity')
  })

  it('reports the fit per piece and for the request', () => {
    const kiln = electricKiln({ usableHeightMm: 300 })
    const { fit } = checkWare(kiln, glazeFiring({ load: { room: room(2) } }), [cube, mug({ heightMm: 400 })])
    expect(fit.pieces.map((piece) => [piece.fitsHeight, piece.fitsFootprint])).toEqual([
      [true, true],
      [false, true],
    ])
    expect(fit.shelvesLeft).toBe(0)
    expect(fit.fitsLoad).toBe(false)
    expect(fit.requestVolumeL).toBeCloseTo(1 + (400 * 90 * 90) / 1e6, 9)
  })
})

describe('clay-overfire', () => {
  it('blocks clay fired past its maturity (it slumps, bloats or melts onto the shelf)', () => {
    const earthenware = { body: 'earthenware' as const, minCone: '06', maxCone: '02' }
    const finding = expectOne(electricKiln(), glazeFiring(), [mug({ clay: earthenware, glaze: undefined })], 'clay-overfire', 'block')
    expect(finding.message).toContain('cone 02')
    // Also in a bisque: cone 04 is past a cone 06 clay's limit.
    expectOne(
      electricKiln(),
      bisqueFiring(),
      [greenBowl({ clay: { body: 'earthenware', minCone: '08', maxCone: '06' } })],
      'clay-overfire',
      'block',
    )
  })

  it('passes clay at its top cone', () => {
    expectNone(electricKiln(), glazeFiring({ cone: '7' }), [mug()], 'clay-overfire')
  })
})

describe('clay-underfire', () => {
  // Common practice: earthenware fired around 1800–2100 °F stays porous (it keeps bound water and heats in
  // a microwave) while vitrified stoneware does not, so a stoneware glaze firing at earthenware heat underfires it.
  it('warns when a glaze firing is cooler than the clay matures', () => {
    const finding = expectOne(
      electricKiln(),
      glazeFiring({ cone: '04' }),
      [mug({ glaze: { minCone: '06', maxCone: '04' } })],
      'clay-underfire',
      'warn',
    )
    expect(finding.message).toContain('cone 5')
    expectOne(electricKiln(), glazeFiring({ kind: 'single', cone: '04' }), [greenBowl()], 'clay-underfire', 'warn')
  })

  it('passes a bisque below the clay’s maturity: that is normal', () => {
    expectNone(electricKiln(), bisqueFiring({ cone: '04' }), [greenBowl()], 'clay-underfire')
  })

  it('passes a glaze firing at the clay’s maturity', () => {
    expectNone(electricKiln(), glazeFiring({ cone: '5' }), [mug()], 'clay-underfire')
  })
})

describe('glaze-cone-mismatch', () => {
  it('blocks a firing hotter than the glaze (it runs)', () => {
    expectOne(electricKiln(), glazeFiring({ cone: '7' }), [mug({ glaze: { minCone: '5', maxCone: '6' } })], 'glaze-cone-mismatch', 'block')
  })

  it('warns on a firing cooler than the glaze', () => {
    expectOne(electricKiln(), glazeFiring({ cone: '5' }), [mug({ glaze: { minCone: '6', maxCone: '7' } })], 'glaze-cone-mismatch', 'warn')
  })

  it('passes a firing within the glaze’s range', () => {
    expectNone(electricKiln(), glazeFiring({ cone: '6' }), [mug({ glaze: { minCone: '6', maxCone: '6' } })], 'glaze-cone-mismatch')
  })
})

describe('glaze-in-bisque', () => {
  it('blocks a glazed piece in a bisque firing', () => {
    expectOne(electricKiln(), bisqueFiring(), [greenBowl({ glaze: { minCone: '5', maxCone: '7' } })], 'glaze-in-bisque', 'block')
  })

  it('passes unglazed ware in a bisque and glazed ware in a single firing', () => {
    expectNone(electricKiln(), bisqueFiring(), [greenBowl()], 'glaze-in-bisque')
    expectNone(electricKiln(), glazeFiring({ kind: 'single' }), [greenBowl({ glaze: { minCone: '5', maxCone: '7' } })], 'glaze-in-bisque')
  })
})

describe('not-bisqued', () => {
  it('blocks greenware in a glaze firing', () => {
    expectOne(electricKiln(), glazeFiring(), [greenBowl({ glaze: { minCone: '5', maxCone: '7' } })], 'not-bisqued', 'block')
  })

  it('passes greenware in a single firing and bisque ware in a glaze firing', () => {
    expectNone(electricKiln(), glazeFiring({ kind: 'single' }), [greenBowl({ glaze: { minCone: '5', maxCone: '7' } })], 'not-bisqued')
    expectNone(electricKiln(), glazeFiring(), [mug()], 'not-bisqued')
  })
})

describe('wet-greenware', () => {
  // Common practice: water leaves the clay up to its boiling point, and wet ware can burst past it.
  it('blocks greenware not declared bone dry', () => {
    const finding = expectOne(electricKiln(), bisqueFiring(), [greenBowl({ boneDry: undefined })], 'wet-greenware', 'block')
    expect(finding.message).toMatch(/bone dry/)
    expectOne(electricKiln(), bisqueFiring(), [greenBowl({ boneDry: false })], 'wet-greenware', 'block')
  })

  it('passes bone-dry greenware and bisque ware', () => {
    expectNone(electricKiln(), bisqueFiring(), [greenBowl({ boneDry: true })], 'wet-greenware')
    expectNone(electricKiln(), glazeFiring(), [mug()], 'wet-greenware')
  })
})

describe('thick-wall-preheat', () => {
  const thickBowl = greenBowl({ wallThicknessMm: 20 })

  it('warns that thick greenware needs a long preheat, and the plan holds longer for it', () => {
    const finding = expectOne(electricKiln(), bisqueFiring(), [thickBowl], 'thick-wall-preheat', 'warn')
    expect(finding.message).toMatch(/candled for/)
    const thin = checkWare(electricKiln(), bisqueFiring(), [greenBowl()])
    const thick = checkWare(electricKiln(), bisqueFiring(), [thickBowl])
    expect(thick.schedule.candlingHoldMinutes).toBeGreaterThan(thin.schedule.candlingHoldMinutes)
  })

  it('blocks thick greenware in a kiln that cannot hold a preheat', () => {
    expectOne(electricKiln({ preheatHold: false }), bisqueFiring(), [thickBowl], 'thick-wall-preheat', 'block')
  })

  it('passes walls at the threshold (13 mm, about half an inch)', () => {
    expectNone(electricKiln({ preheatHold: false }), bisqueFiring(), [greenBowl({ wallThicknessMm: 13 })], 'thick-wall-preheat')
  })
})

describe('glaze-on-foot', () => {
  it('blocks glaze on the foot without a cookie or stilt', () => {
    expectOne(electricKiln(), glazeFiring(), [mug({ glaze: { minCone: '5', maxCone: '7', onFoot: true } })], 'glaze-on-foot', 'block')
  })

  it('passes a glazed foot set on a cookie or stilt, and a clean foot', () => {
    expectNone(
      electricKiln(),
      glazeFiring(),
      [mug({ glaze: { minCone: '5', maxCone: '7', onFoot: true, support: 'cookie' } })],
      'glaze-on-foot',
    )
    expectNone(electricKiln(), glazeFiring(), [mug()], 'glaze-on-foot')
  })
})

describe('runny-glaze-tray', () => {
  it('warns to set a runny glaze on a catch tray or cookie', () => {
    const finding = expectOne(
      electricKiln(),
      glazeFiring(),
      [mug({ glaze: { minCone: '5', maxCone: '7', runny: true } })],
      'runny-glaze-tray',
      'warn',
    )
    expect(finding.message).toMatch(/catch cookie or tray/)
  })

  it('passes a runny glaze already on a cookie', () => {
    expectNone(
      electricKiln(),
      glazeFiring(),
      [mug({ glaze: { minCone: '5', maxCone: '7', runny: true, support: 'cookie' } })],
      'runny-glaze-tray',
    )
  })
})

describe('needs-controlled-cooling', () => {
  // Common practice: cristobalite contracts about 3 % on cooling, and fast cooling through the inversions cracks ware.
  const noControl = electricKiln({ controlledCooling: false })

  it('warns when the firing asks for a slow cool the kiln cannot give', () => {
    expectOne(noControl, glazeFiring({ slowCool: true }), [mug()], 'needs-controlled-cooling', 'warn')
  })

  it('warns when thick ware asks for it, naming the piece', () => {
    const finding = expectOne(noControl, glazeFiring(), [mug(), mug({ wallThicknessMm: 20 })], 'needs-controlled-cooling', 'warn')
    expect(finding.pieceIndex).toBe(1)
  })

  it('passes when the kiln can control its cooling, or nothing asks for it', () => {
    expectNone(electricKiln(), glazeFiring({ slowCool: true }), [mug({ wallThicknessMm: 20 })], 'needs-controlled-cooling')
    expectNone(noControl, glazeFiring(), [mug()], 'needs-controlled-cooling')
  })
})

describe('verdict', () => {
  it('is the worst severity found', () => {
    const warnOnly = checkWare(electricKiln(), glazeFiring(), [mug({ glaze: { minCone: '5', maxCone: '7', runny: true } })])
    expect(warnOnly.verdict).toBe('warn')
    const warnAndBlock = checkWare(electricKiln(), glazeFiring({ atmosphere: 'reduction' }), [
      mug({ glaze: { minCone: '5', maxCone: '7', runny: true } }),
    ])
    // The reduction firing also carries its carbon monoxide caution (info).
    expect(warnAndBlock.findings.map((finding) => finding.severity).sort()).toEqual(['block', 'info', 'warn'])
    expect(warnAndBlock.verdict).toBe('block')
  })

  it('leaves info findings at ok', () => {
    expect(verdictOf([{ code: 'runny-glaze-tray', severity: 'info', message: 'note' }])).toBe('ok')
    expect(verdictOf([])).toBe('ok')
    expect(
      verdictOf([
        { code: 'runny-glaze-tray', severity: 'info', message: 'note' },
        { code: 'runny-glaze-tray', severity: 'warn', message: 'note' },
      ]),
    ).toBe('warn')
  })

  it('names each failing piece separately', () => {
    const wet = [greenBowl({ boneDry: false }), greenBowl(), greenBowl({ boneDry: false })]
    const found = findings(electricKiln(), bisqueFiring(), wet, 'wet-greenware')
    expect(found.map((finding) => finding.pieceIndex)).toEqual([0, 2])
  })
})
