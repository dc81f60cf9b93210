// The fuller ware check: each new finding fires where the trade says it should and stays quiet
// otherwise. Facts of the trade are common practice unless a source is named.
import { describe, expect, it } from 'vitest'
import { checkWare, planShelves, type Finding, type FindingCode, type Firing, type Kiln, type Piece } from '../../../shared/firing/check'
import { bisqueFiring, electricKiln, glazeFiring, greenBowl, mug } from './fixtures'

function found(kiln: Kiln, firing: Firing, pieces: Piece[], code: FindingCode): Finding[] {
  return checkWare(kiln, firing, pieces).findings.filter((finding) => finding.code === code)
}

function expectOne(kiln: Kiln, firing: Firing, pieces: Piece[], code: FindingCode, severity: Finding['severity']): Finding {
  const list = found(kiln, firing, pieces, code)
  expect(list, JSON.stringify(checkWare(kiln, firing, pieces).findings.map((f) => f.code))).toHaveLength(1)
  expect(list[0].severity).toBe(severity)
  expect(list[0].message.length).toBeGreaterThan(30)
  return list[0]
}

function expectNone(kiln: Kiln, firing: Firing, pieces: Piece[], code: FindingCode): void {
  expect(found(kiln, firing, pieces, code)).toEqual([])
}

const raku = { body: 'raku' as const, minCone: '010', maxCone: '04' }

describe('solid-too-thick and closed-no-vent (studios refuse them, common practice)', () => {
  it('blocks a solid piece over about 25 mm and passes one at 25 mm', () => {
    expectOne(electricKiln(), bisqueFiring(), [greenBowl({ form: 'solid', wallThicknessMm: 26 })], 'solid-too-thick', 'block')
    expectNone(electricKiln(), bisqueFiring(), [greenBowl({ form: 'solid', wallThicknessMm: 25 })], 'solid-too-thick')
    expectNone(electricKiln(), bisqueFiring(), [greenBowl({ form: 'open', wallThicknessMm: 26 })], 'solid-too-thick')
  })

  it('blocks a closed form without a vent hole, and passes it with one', () => {
    const finding = expectOne(electricKiln(), bisqueFiring(), [greenBowl({ form: 'closed' })], 'closed-no-vent', 'block')
    expect(finding.message).toMatch(/vent hole/)
    expectNone(electricKiln(), bisqueFiring(), [greenBowl({ form: 'closed', ventHole: true })], 'closed-no-vent')
  })
})

describe('supports: cookies, trays and stilts', () => {
  const runny = (support: 'none' | 'cookie' | 'tray' | 'stilt') => mug({ glaze: { minCone: '5', maxCone: '7', runny: true, support } })

  it('waives the runny-glaze warning only for a cookie or tray: a stilt catches no drips', () => {
    expectNone(electricKiln(), glazeFiring(), [runny('cookie')], 'runny-glaze-tray')
    expectNone(electricKiln(), glazeFiring(), [runny('tray')], 'runny-glaze-tray')
    const onStilt = expectOne(electricKiln(), glazeFiring({ cone: '04' }), [runny('stilt')], 'runny-glaze-tray', 'warn')
    expect(onStilt.message).toMatch(/catches no drips/)
  })

  it('blocks a stilt under stoneware or porcelain at cone 1 or hotter; stilts belong to low fire', () => {
    const stilted = (body: 'stoneware' | 'porcelain' | 'earthenware') =>
      mug({ clay: { body, minCone: '06', maxCone: '10' }, glaze: { minCone: '06', maxCone: '10', support: 'stilt' } })
    expectOne(electricKiln(), glazeFiring({ cone: '1' }), [stilted('stoneware')], 'stilt-high-fire', 'block')
    expectOne(electricKiln(), glazeFiring({ cone: '6' }), [stilted('porcelain')], 'stilt-high-fire', 'block')
    expectNone(electricKiln(), glazeFiring({ cone: '01' }), [stilted('stoneware')], 'stilt-high-fire')
    const earthenware = mug({
      clay: { body: 'earthenware', minCone: '06', maxCone: '04' },
      glaze: { minCone: '06', maxCone: '04', support: 'stilt' },
    })
    expectNone(electricKiln(), glazeFiring({ cone: '04' }), [earthenware], 'stilt-high-fire')
  })
})

describe('clay-body-range', () => {
  it('blocks earthenware declared hotter than cone 1 and porcelain declared cooler than cone 4', () => {
    const earthenware = mug({ clay: { body: 'earthenware', minCone: '04', maxCone: '6' } })
    expectOne(electricKiln(), glazeFiring(), [earthenware], 'clay-body-range', 'block')
    const porcelain = mug({ clay: { body: 'porcelain', minCone: '06', maxCone: '3' } })
    expectOne(electricKiln(), glazeFiring({ cone: '3' }), [porcelain], 'clay-body-range', 'block')
    expectNone(
      electricKiln(),
      glazeFiring({ cone: '04' }),
      [mug({ clay: { body: 'earthenware', minCone: '06', maxCone: '1' } })],
      'clay-body-range',
    )
    expectNone(electricKiln(), glazeFiring(), [mug({ clay: { body: 'porcelain', minCone: '5', maxCone: '10' } })], 'clay-body-range')
  })
})

describe('glaze chemistry in a shared load', () => {
  it('notes a reduction-only glaze in oxidation (copper reds, celadons)', () => {
    const copperRed = mug({ glaze: { minCone: '5', maxCone: '7', reductionOnly: true } })
    expectOne(electricKiln(), glazeFiring(), [copperRed], 'reduction-glaze', 'info')
    expectNone(electricKiln({ atmospheres: ['reduction'] }), glazeFiring({ atmosphere: 'reduction' }), [copperRed], 'reduction-glaze')
  })

  it('warns of chrome–tin pinks and copper flashing onto neighbours, once per request', () => {
    const pink = mug({ glaze: { minCone: '5', maxCone: '7', colourants: ['chrome-tin'] } })
    const copper = mug({ glaze: { minCone: '5', maxCone: '7', colourants: ['copper'] } })
    expectOne(electricKiln(), glazeFiring(), [pink, copper], 'volatile-colourant', 'warn')
    expectOne(electricKiln(), glazeFiring(), [copper], 'volatile-colourant', 'warn')
    expectNone(
      electricKiln(),
      glazeFiring(),
      [mug({ glaze: { minCone: '5', maxCone: '7', colourants: ['cobalt'] } })],
      'volatile-colourant',
    )
    expectNone(electricKiln(), glazeFiring({ sharedLoad: false }), [copper], 'volatile-colourant')
  })

  it('asks for a test tile for an untried glaze', () => {
    expectOne(electricKiln(), glazeFiring(), [mug({ glaze: { minCone: '5', maxCone: '7', tested: false } })], 'untested-glaze', 'warn')
    expectNone(electricKiln(), glazeFiring(), [mug()], 'untested-glaze')
  })
})

describe('foreign-material', () => {
  it('blocks metal in any load', () => {
    expectOne(electricKiln(), glazeFiring({ sharedLoad: false }), [mug({ materials: ['metal'] })], 'foreign-material', 'block')
  })

  it('blocks glass or combustibles in a shared load unless on a tray or in a saggar', () => {
    expectOne(electricKiln(), glazeFiring(), [mug({ materials: ['glass'] })], 'foreign-material', 'block')
    expectOne(electricKiln(), bisqueFiring(), [greenBowl({ materials: ['combustible'] })], 'foreign-material', 'block')
    expectNone(
      electricKiln(),
      glazeFiring(),
      [mug({ materials: ['glass'], glaze: { minCone: '5', maxCone: '7', support: 'tray' } })],
      'foreign-material',
    )
    expectNone(electricKiln(), glazeFiring({ sharedLoad: false }), [mug({ materials: ['glass'] })], 'foreign-material')
  })
})

describe('shelf-overweight', () => {
  const kiln = electricKiln({ shelfLoadKg: 10 })

  it('blocks a single piece heavier than one shelf carries', () => {
    expectOne(kiln, glazeFiring(), [mug({ weightG: 12_000 })], 'shelf-overweight', 'block')
    expectNone(kiln, glazeFiring(), [mug({ weightG: 9_000 })], 'shelf-overweight')
  })

  it('blocks a plan that puts more than the shelf carries on one shelf', () => {
    // Twenty 1.2 kg mugs, 90 mm across, all fit one 530 mm shelf: 24 kg on it.
    const heavy = mug({ weightG: 1_200, quantity: 20 })
    const shelves = planShelves(kiln, [heavy])
    expect(shelves).toHaveLength(1)
    expect(shelves[0].weightKg).toBeCloseTo(24, 9)
    expectOne(kiln, glazeFiring(), [heavy], 'shelf-overweight', 'block')
    expectNone(electricKiln(), glazeFiring(), [heavy], 'shelf-overweight')
  })

  it('starts a new shelf when the footprints fill one', () => {
    // 200 × 200 mm tiles: a 530 mm shelf (220 618 mm², 80 % usable) takes four.
    const tiles = mug({ round: false, widthMm: 200, depthMm: 200, weightG: 500, quantity: 9 })
    expect(planShelves(kiln, [tiles]).map((shelf) => shelf.lines[0].count)).toEqual([4, 4, 1])
  })
})

describe('lustre firings (overglaze, decals, china paint at cone 022–015, common practice)', () => {
  const glazed = mug({ state: 'glazed' })

  it('passes glazed ware at cone 018 with its fume caution', () => {
    const check = checkWare(electricKiln(), { kind: 'lustre', cone: '018', atmosphere: 'oxidation' }, [glazed])
    expect(check.verdict).toBe('ok')
    expect(check.findings.map((f) => f.code)).toEqual(['firing-safety'])
    expect(check.findings[0].message).toMatch(/fumes/)
  })

  it('blocks a lustre firing hotter than cone 015 and ware that is not glaze fired', () => {
    expectOne(electricKiln(), { kind: 'lustre', cone: '06', atmosphere: 'oxidation' }, [glazed], 'lustre-cone', 'block')
    expectOne(electricKiln(), { kind: 'lustre', cone: '018', atmosphere: 'oxidation' }, [mug()], 'lustre-ware', 'block')
  })
})

describe('raku firings', () => {
  const rakuKiln = electricKiln({ kind: 'raku', maxRampCPerHour: 600, controlledCooling: false, atmospheres: ['oxidation', 'reduction'] })
  const rakuPot = mug({ clay: raku, glaze: { minCone: '06', maxCone: '04' } })
  const firing: Firing = { kind: 'raku', cone: '06', atmosphere: 'reduction' }

  it('passes bisqued raku-body ware in a raku kiln, with the gear and outdoor caution', () => {
    const check = checkWare(rakuKiln, firing, [rakuPot])
    expect(check.verdict).toBe('ok')
    const safety = check.findings.find((f) => f.code === 'firing-safety')!
    expect(safety.message).toMatch(/outdoors/)
    expect(safety.message).toMatch(/gloves/)
    expect(safety.message).toMatch(/carbon monoxide/)
  })

  it('requires a raku body, a raku kiln and bisqued ware', () => {
    expectOne(
      rakuKiln,
      firing,
      [mug({ clay: { body: 'stoneware', minCone: '06', maxCone: '10' }, glaze: { minCone: '06', maxCone: '04' } })],
      'raku-body',
      'block',
    )
    expectOne(electricKiln(), firing, [rakuPot], 'raku-kiln', 'block')
    expectOne(rakuKiln, firing, [{ ...rakuPot, state: 'greenware', boneDry: true }], 'raku-ware', 'block')
  })
})

describe('safety cautions', () => {
  it('names carbon monoxide for a reduction firing', () => {
    const kiln = electricKiln({ atmospheres: ['reduction'] })
    expect(expectOne(kiln, glazeFiring({ atmosphere: 'reduction' }), [mug()], 'firing-safety', 'info').message).toMatch(/carbon monoxide/)
  })
})

describe('cooling profiles', () => {
  it('warns when the firing asks for a glaze-development cool and the kiln cannot control its cooling', () => {
    expectOne(
      electricKiln({ controlledCooling: false }),
      glazeFiring({ cooling: 'glaze-development' }),
      [mug()],
      'needs-controlled-cooling',
      'warn',
    )
    expectNone(electricKiln(), glazeFiring({ cooling: 'glaze-development' }), [mug()], 'needs-controlled-cooling')
  })
})
