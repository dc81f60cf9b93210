// Reading damage by firing phase. The readings of cracks, bursts, bloats and runs are common practice
// in the trade (the way studios read a failed load; from memory of standard ceramics handbooks, not a
// single table): burst → water smoking; glaze-rounded crack → opened on heating (quartz, 573 °C, a
// handbook value); sharp crack → cooling dunt at quartz or cristobalite (about 220 °C); bloating and
// black cores → burnout or overfiring; runs and slumps → past the cone. Heat work is read with the
// cone model fitted to the published Orton chart (shared/firing/heatwork.ts).

import { describe, expect, it } from 'vitest'
import { coneFromCurve, type CurvePoint } from '../../../shared/firing/heatwork'
import {
  DIAGNOSIS_RULES,
  INCIDENT_PHASES,
  PHASE_ADVICE,
  diagnose,
  zonesLogged,
  type IncidentContext,
  type IncidentObservation,
} from '../../../shared/firing/incidents'
import { planSchedule } from '../../../shared/firing/schedule'
import { bisqueFiring, electricKiln, glazeFiring, greenBowl, mug } from './fixtures'

/** A logged curve from room heat: each stretch runs to toC at rateCPerHour, holds optional. */
function curve(stretches: readonly [toC: number, rateCPerHour: number, holdMinutes?: number][]): CurvePoint[] {
  const points: CurvePoint[] = [{ minute: 0, tempC: 20 }]
  for (const [toC, rate, hold = 0] of stretches) {
    const last = points[points.length - 1]
    const minute = last.minute + (Math.abs(toC - last.tempC) / rate) * 60
    points.push({ minute, tempC: toC })
    if (hold > 0) points.push({ minute: minute + hold, tempC: toC })
  }
  return points
}

const kiln = electricKiln()

/** A bisque load of one greenware bowl with its plan. */
function bisqueContext(overrides: Partial<IncidentContext> = {}, bowl = greenBowl()): IncidentContext {
  const firing = bisqueFiring()
  const plan = planSchedule({ kind: firing.kind, cone: firing.cone, kiln, pieces: [bowl] }).segments
  return { firing, pieces: [bowl], kiln, plan, ...overrides }
}

/** A cone 6 glaze load of one stoneware mug with its plan. */
function glazeContext(overrides: Partial<IncidentContext> = {}, piece = mug()): IncidentContext {
  const firing = glazeFiring()
  const plan = planSchedule({ kind: firing.kind, cone: firing.cone, kiln, pieces: [piece] }).segments
  return { firing, pieces: [piece], kiln, plan, ...overrides }
}

// Curves that stay well under every planned rate, except where a case speeds one zone up. Peaking at
// 1185 °C after this slow climb does the heat work of cone 6 (the fitted chart), as planned.
const SLOW_TO_CONE_6 = curve([
  [200, 30],
  [1100, 50],
  [1185, 40, 10],
])
const slowCool = (from: CurvePoint[]) => {
  const last = from[from.length - 1]
  return [...from, { minute: last.minute + ((last.tempC - 30) / 20) * 60, tempC: 30 }]
}
const GENTLE_GLAZE_LOG = slowCool(SLOW_TO_CONE_6)

const blowout: IncidentObservation = { kind: 'blowout', shards: true, neighboursHit: true }
const sharpCrack: IncidentObservation = { kind: 'crack', crackEdge: 'sharp' }
const roundedCrack: IncidentObservation = { kind: 'crack', crackEdge: 'rounded' }

/** For every rule, a case where it fires; the phase it weighs must be among the candidates with it. */
const RULE_CASES: Record<string, [IncidentObservation, IncidentContext]> = {
  'blowout-steam': [blowout, bisqueContext()],
  'blowout-trapped-air': [blowout, bisqueContext()],
  'shards-thrown': [blowout, bisqueContext()],
  'rounded-crack-heating': [roundedCrack, glazeContext()],
  'rounded-crack-not-quartz-cooling': [roundedCrack, glazeContext()],
  'rounded-crack-not-cristobalite': [roundedCrack, glazeContext()],
  'sharp-crack-quartz-cooling': [sharpCrack, glazeContext()],
  'sharp-crack-cristobalite': [sharpCrack, glazeContext()],
  'sharp-crack-not-heating': [sharpCrack, glazeContext()],
  'crack-may-be-heating': [{ kind: 'crack' }, glazeContext()],
  'crack-may-be-quartz-cooling': [{ kind: 'crack' }, glazeContext()],
  'crack-may-be-cristobalite': [{ kind: 'crack' }, glazeContext()],
  'bloat-overfire': [{ kind: 'bloating' }, glazeContext()],
  'bloat-burnout': [{ kind: 'black-core' }, glazeContext()],
  'slump-overfire': [{ kind: 'slumping' }, glazeContext()],
  'run-or-stuck-peak': [{ kind: 'glaze-run' }, glazeContext()],
  'ware-wet': [blowout, bisqueContext({}, greenBowl({ boneDry: false }))],
  'ware-thick': [blowout, bisqueContext({}, greenBowl({ form: 'solid', wallThicknessMm: 60, widthMm: 80, depthMm: 80 }))],
  'ware-closed-no-vent': [blowout, bisqueContext({}, greenBowl({ form: 'closed', ventHole: false }))],
  'ware-already-fired': [blowout, glazeContext()],
  'ware-thick-uneven-heating': [roundedCrack, bisqueContext({}, greenBowl({ wallThicknessMm: 25 }))],
  'ware-thick-cooling': [sharpCrack, glazeContext({}, mug({ wallThicknessMm: 20 }))],
  'body-free-silica': [sharpCrack, glazeContext()],
  'body-past-its-cone': [{ kind: 'slumping' }, glazeContext({}, mug({ clay: { body: 'earthenware', minCone: '06', maxCone: '02' } }))],
  'glaze-against-cone': [{ kind: 'glaze-run' }, glazeContext({}, mug({ glaze: { minCone: '06', maxCone: '04' } }))],
  'glaze-runny-or-on-foot': [{ kind: 'stuck' }, glazeContext({}, mug({ glaze: { minCone: '5', maxCone: '7', onFoot: true } }))],
  'log-fast-water-smoking': [
    blowout,
    bisqueContext({
      readings: curve([
        [200, 400],
        [1000, 40],
        [1060, 40],
        [30, 20],
      ]),
    }),
  ],
  'log-fast-burnout': [
    { kind: 'black-core' },
    glazeContext({
      readings: curve([
        [300, 30],
        [870, 400],
        [1222, 40],
        [30, 20],
      ]),
    }),
  ],
  'log-fast-quartz-heating': [
    roundedCrack,
    glazeContext({
      readings: curve([
        [200, 30],
        [540, 50],
        [610, 400],
        [1222, 40],
        [30, 20],
      ]),
    }),
  ],
  'log-fast-quartz-cooling': [sharpCrack, glazeContext({ readings: fastCoolThrough(620, 480) })],
  'log-fast-cristobalite-cooling': [sharpCrack, glazeContext({ readings: fastCoolThrough(260, 150) })],
  'log-steady-water-smoking': [
    blowout,
    bisqueContext({
      readings: curve([
        [200, 30],
        [1000, 40],
        [1060, 40],
        [30, 20],
      ]),
    }),
  ],
  'log-steady-burnout': [{ kind: 'black-core' }, glazeContext({ readings: GENTLE_GLAZE_LOG })],
  'log-steady-quartz-heating': [roundedCrack, glazeContext({ readings: GENTLE_GLAZE_LOG })],
  'log-steady-quartz-cooling': [sharpCrack, glazeContext({ readings: GENTLE_GLAZE_LOG })],
  'log-steady-cristobalite-cooling': [sharpCrack, glazeContext({ readings: GENTLE_GLAZE_LOG })],
  'log-overfired': [
    { kind: 'slumping' },
    glazeContext({
      readings: curve([
        [200, 30],
        [1100, 50],
        [1290, 40, 60],
        [30, 20],
      ]),
    }),
  ],
  'log-reached-planned-cone': [{ kind: 'slumping' }, glazeContext({ readings: GENTLE_GLAZE_LOG })],
}

/** Up gently to cone 6, cool gently to fromC, then fast (600 °C/h) to toC, then gently to room heat. */
function fastCoolThrough(fromC: number, toC: number): CurvePoint[] {
  const up = [...SLOW_TO_CONE_6]
  const end = up[up.length - 1]
  const toFrom = end.minute + ((end.tempC - fromC) / 20) * 60
  const fast = toFrom + ((fromC - toC) / 600) * 60
  return [...up, { minute: toFrom, tempC: fromC }, { minute: fast, tempC: toC }, { minute: fast + ((toC - 30) / 20) * 60, tempC: 30 }]
}

describe('diagnosis rules', () => {
  it('every rule names its source, and has a case below', () => {
    for (const rule of DIAGNOSIS_RULES) {
      expect(rule.source, rule.id).toMatch(/common practice|Orton/)
      expect(RULE_CASES[rule.id], `a case for ${rule.id}`).toBeDefined()
    }
    expect(new Set(DIAGNOSIS_RULES.map((r) => r.id)).size).toBe(DIAGNOSIS_RULES.length)
  })

  for (const rule of DIAGNOSIS_RULES) {
    it(`${rule.id} weighs ${rule.stance} ${rule.phase} when its facts hold (${rule.source})`, () => {
      const [seen, context] = RULE_CASES[rule.id]
      const candidate = diagnose(seen, context).candidates.find((c) => c.phase === rule.phase)
      expect(candidate, `${rule.phase} is a candidate`).toBeDefined()
      expect(candidate!.rules).toContain(rule.id)
      const said = rule.stance === 'for' ? candidate!.for : candidate!.against
      expect(said.length).toBeGreaterThan(0)
    })
  }

  it('rules stay silent when their facts do not hold: a dry, thin, open bowl in a gentle log', () => {
    const { candidates } = diagnose(
      blowout,
      bisqueContext({
        readings: curve([
          [200, 30],
          [1000, 40],
          [1060, 40],
          [30, 20],
        ]),
      }),
    )
    const fired = candidates.flatMap((c) => c.rules)
    for (const id of ['ware-wet', 'ware-thick', 'ware-closed-no-vent', 'ware-already-fired', 'log-fast-water-smoking']) {
      expect(fired).not.toContain(id)
    }
  })

  it('the gentle test logs really are gentle, and pass through every zone', () => {
    const zones = zonesLogged(GENTLE_GLAZE_LOG)
    for (const zone of ['water-smoking', 'burnout', 'quartz-heating', 'quartz-cooling', 'cristobalite-cooling'] as const)
      expect(zones.has(zone)).toBe(true)
    expect(diagnose(sharpCrack, glazeContext({ readings: GENTLE_GLAZE_LOG })).curveFlags).toEqual([])
    expect(coneFromCurve(GENTLE_GLAZE_LOG).cone).toBe('6')
  })
})

describe('diagnose', () => {
  it('a blowout after a fast early climb is water smoking, sure of it, with the log stretch as a reason', () => {
    const readings = curve([
      [200, 400],
      [1000, 40],
      [1060, 40],
      [30, 20],
    ])
    const d = diagnose(blowout, bisqueContext({ readings }, greenBowl({ boneDry: false })))
    expect(d.phase).toBe('water-smoking')
    expect(d.confidence).toBe('high')
    expect(d.reasons.some((r) => /Water smoking: climbed at up to 400 °C\/h/.test(r))).toBe(true)
    expect(d.advice.some((a) => a.for === 'potter' && /bone dry/.test(a.text))).toBe(true)
    expect(d.advice.some((a) => a.for === 'studio' && /Candle/.test(a.text))).toBe(true)
  })

  it('a sharp crack after the kiln was cooled fast through 260–150 °C is a cristobalite dunt', () => {
    const d = diagnose(sharpCrack, glazeContext({ readings: fastCoolThrough(260, 150) }))
    expect(d.phase).toBe('cristobalite-cooling')
    expect(d.confidence).toBe('high')
    const quartzHeating = d.candidates.find((c) => c.phase === 'quartz-heating')!
    expect(quartzHeating.against.join(' ')).toMatch(/sharp/)
  })

  it('a sharp crack after a fast cool through 620–480 °C is a quartz dunt', () => {
    const d = diagnose(sharpCrack, glazeContext({ readings: fastCoolThrough(620, 480) }))
    expect(d.phase).toBe('quartz-cooling')
    expect(d.reasons.join(' ')).toMatch(/Quartz inversion \(cooling\)/)
  })

  it('a crack with glaze-rounded edges opened on heating, whatever the cooling did', () => {
    const d = diagnose(roundedCrack, glazeContext({ readings: fastCoolThrough(260, 150) }))
    expect(d.phase).toBe('quartz-heating')
  })

  it('a glaze run in a load that logged past its cone points at the peak, with the logged cone named', () => {
    const readings = curve([
      [200, 30],
      [1100, 50],
      [1290, 40, 60],
      [30, 20],
    ])
    const logged = coneFromCurve(readings).cone!
    const d = diagnose({ kind: 'glaze-run' }, glazeContext({ readings }))
    expect(d.phase).toBe('peak')
    expect(d.reasons.join(' ')).toContain(`cone ${logged}`)
  })

  it('without a log or a check, a bare observation still gives a phase, but never a sure one', () => {
    const d = diagnose(sharpCrack, { firing: glazeFiring(), pieces: [] })
    expect(INCIDENT_PHASES).toContain(d.phase)
    expect(d.confidence).not.toBe('high')
  })

  it('every phase has advice for both sides', () => {
    for (const phase of INCIDENT_PHASES) {
      expect(PHASE_ADVICE[phase].potter.length).toBeGreaterThan(0)
      expect(PHASE_ADVICE[phase].studio.length).toBeGreaterThan(0)
    }
  })
})
