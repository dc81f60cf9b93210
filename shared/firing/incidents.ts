// Reading damage by firing phase. The trade dates a failure by what it looks like: a burst piece lost
// its water too fast; a crack whose edges the glaze flowed into and rounded was open before the glaze
// melted, so it opened on heating; a sharp crack through glaze and body opened on cooling, at the quartz
// or the cristobalite inversion; bloating, black cores, slumping and runs point at the burnout or the
// peak (all common practice). The observation names the candidate phases; the ware's own check and the
// logged curve then weigh them. Every rule is data with its source, so each is tested on its own and
// the reasons a studio reads are the rules that fired.

import { coneIndex, formatCone, type Cone } from './cones'
import { checkWare, type ClayBody, type Finding, type FindingCode, type Firing, type Kiln, type Piece } from './check'
import { coneFromCurve, type CurvePoint } from './heatwork'
import { CRITICAL_ZONES, criticalZone, curveFlags, type CriticalZoneId, type CurveFlag } from './curve'
import { wareAsksForSlowCooling, type Segment } from './schedule'

export const INCIDENT_KINDS = ['blowout', 'crack', 'bloating', 'black-core', 'slumping', 'glaze-run', 'stuck'] as const
export type IncidentKind = (typeof INCIDENT_KINDS)[number]

export const INCIDENT_KIND_LABELS: Record<IncidentKind, string> = {
  blowout: 'Blew apart (blowout)',
  crack: 'Cracked',
  bloating: 'Bloated or blistered body',
  'black-core': 'Black core',
  slumping: 'Slumped or warped',
  'glaze-run': 'Glaze ran',
  stuck: 'Stuck to the shelf',
}

/** The edge of a crack: sharp and clean, or rounded where glaze flowed into it. */
export const CRACK_EDGES = ['sharp', 'rounded', 'unknown'] as const
export type CrackEdge = (typeof CRACK_EDGES)[number]

export const INCIDENT_PHASES = ['water-smoking', 'burnout', 'quartz-heating', 'peak', 'quartz-cooling', 'cristobalite-cooling'] as const
export type IncidentPhase = (typeof INCIDENT_PHASES)[number]

export const PHASE_LABELS: Record<IncidentPhase, string> = {
  'water-smoking': 'Water smoking (early heating)',
  burnout: 'Burnout',
  'quartz-heating': 'Quartz inversion on heating',
  peak: 'At peak (too hot for the body or glaze)',
  'quartz-cooling': 'Quartz inversion on cooling',
  'cristobalite-cooling': 'Cristobalite inversion on cooling',
}

/** What the crew or the potter saw when the kiln was opened. */
export interface IncidentObservation {
  kind: IncidentKind
  /** For cracks: the edge's look decides heating against cooling. */
  crackEdge?: CrackEdge
  /** Pieces of the ware were thrown about the kiln. */
  shards?: boolean
  /** Other ware in the load was hit or stuck. */
  neighboursHit?: boolean
  shelfDamage?: boolean
  elementDamage?: boolean
}

/** What is known of the firing and the ware besides what was seen. */
export interface IncidentContext {
  firing: Pick<Firing, 'kind' | 'cone' | 'atmosphere'> & Partial<Firing>
  /** The pieces concerned, as the potter declared them. */
  pieces: readonly Piece[]
  /** The kiln, so the ware check can be run again; or pass the findings directly. */
  kiln?: Kiln
  findings?: readonly Finding[]
  /** The planned schedule and the logged curve; without both the curve rules stay silent. */
  plan?: readonly Segment[]
  readings?: readonly CurvePoint[]
}

/** The facts every rule reads, worked out once. */
export interface IncidentFacts {
  seen: IncidentObservation
  firing: IncidentContext['firing']
  pieces: readonly Piece[]
  codes: ReadonlySet<FindingCode>
  flags: readonly CurveFlag[]
  /** Critical zones the log passes through, in the zone's own direction. */
  logged: ReadonlySet<CriticalZoneId>
  /** The cone the logged curve brings down; undefined without a log. */
  loggedCone?: Cone | null
}

export interface DiagnosisRule {
  id: string
  phase: IncidentPhase
  stance: 'for' | 'against'
  weight: number
  /** 'common practice', or the reference the rule comes from. */
  source: string
  /** Rules on what was seen make a phase a candidate; the others only weigh candidates. */
  opens?: boolean
  when: (facts: IncidentFacts) => boolean
  says: (facts: IncidentFacts) => string
}

const COMMON = 'common practice'

const isCrack = (f: IncidentFacts, edge: CrackEdge) => f.seen.kind === 'crack' && (f.seen.crackEdge ?? 'unknown') === edge
const anyPiece = (f: IncidentFacts, test: (piece: Piece) => boolean) => f.pieces.some(test)
const glazeFiring = (f: IncidentFacts) => f.firing.kind === 'glaze' || f.firing.kind === 'single'
const flagIn = (f: IncidentFacts, zone: CriticalZoneId) => f.flags.find((flag) => flag.zone === zone)
const HIGH_FIRE_BODIES: readonly ClayBody[] = ['stoneware', 'porcelain']

/** A fast stretch of the log through the zone that matches the phase weighs heavily for it. */
function fastThrough(phase: IncidentPhase & CriticalZoneId): DiagnosisRule {
  const zone = criticalZone(phase)
  return {
    id: `log-fast-${phase}`,
    phase,
    stance: 'for',
    weight: 3,
    source: `${COMMON}; zone ${zone.lowC}–${zone.highC} °C`,
    when: (f) => flagIn(f, phase) !== undefined,
    says: (f) => `The log ${zone.direction === 'heating' ? 'climbed' : 'cooled'} faster than planned here: ${flagIn(f, phase)!.message}`,
  }
}

/** A log that went through the zone no faster than planned argues against it. */
function steadyThrough(phase: IncidentPhase & CriticalZoneId): DiagnosisRule {
  const zone = criticalZone(phase)
  return {
    id: `log-steady-${phase}`,
    phase,
    stance: 'against',
    weight: 1,
    source: COMMON,
    when: (f) => f.logged.has(phase) && flagIn(f, phase) === undefined,
    says: () => `The log went through ${zone.lowC}–${zone.highC} °C no faster than the plan allowed.`,
  }
}

export const DIAGNOSIS_RULES: readonly DiagnosisRule[] = [
  // What was seen.
  {
    id: 'blowout-steam',
    phase: 'water-smoking',
    stance: 'for',
    weight: 3,
    source: COMMON,
    opens: true,
    when: (f) => f.seen.kind === 'blowout',
    says: () =>
      'A piece that bursts apart usually does so below about 200 °C, when water in the wall turns to steam faster than it can leave.',
  },
  {
    id: 'blowout-trapped-air',
    phase: 'burnout',
    stance: 'for',
    weight: 1,
    source: COMMON,
    opens: true,
    when: (f) => f.seen.kind === 'blowout',
    says: () => 'Less often a burst comes later, from trapped air or organic matter gassing in a sealed or very thick wall.',
  },
  {
    id: 'shards-thrown',
    phase: 'water-smoking',
    stance: 'for',
    weight: 1,
    source: COMMON,
    when: (f) => f.seen.shards === true,
    says: () => 'Shards thrown across the kiln mean pressure inside the wall, which is steam far more often than anything else.',
  },
  {
    id: 'rounded-crack-heating',
    phase: 'quartz-heating',
    stance: 'for',
    weight: 3,
    source: COMMON,
    opens: true,
    when: (f) => isCrack(f, 'rounded'),
    says: () =>
      'Glaze flowed into the crack and rounded its edges, so it was open before the glaze melted: it opened on heating, most often at the quartz inversion near 573 °C.',
  },
  {
    id: 'rounded-crack-not-quartz-cooling',
    phase: 'quartz-cooling',
    stance: 'against',
    weight: 3,
    source: COMMON,
    when: (f) => isCrack(f, 'rounded'),
    says: () => 'A crack that opened on cooling would have sharp edges: the glaze was already set.',
  },
  {
    id: 'rounded-crack-not-cristobalite',
    phase: 'cristobalite-cooling',
    stance: 'against',
    weight: 3,
    source: COMMON,
    when: (f) => isCrack(f, 'rounded'),
    says: () => 'A crack that opened on cooling would have sharp edges: the glaze was already set.',
  },
  {
    id: 'sharp-crack-quartz-cooling',
    phase: 'quartz-cooling',
    stance: 'for',
    weight: 2,
    source: COMMON,
    opens: true,
    when: (f) => isCrack(f, 'sharp'),
    says: () =>
      'A sharp, clean crack through glaze and body is a cooling dunt; the quartz inversion near 573 °C is one of the two places it happens.',
  },
  {
    id: 'sharp-crack-cristobalite',
    phase: 'cristobalite-cooling',
    stance: 'for',
    weight: 2,
    source: COMMON,
    opens: true,
    when: (f) => isCrack(f, 'sharp'),
    says: () =>
      'A sharp, clean crack through glaze and body is a cooling dunt; the cristobalite inversion near 220 °C is the other place it happens.',
  },
  {
    id: 'sharp-crack-not-heating',
    phase: 'quartz-heating',
    stance: 'against',
    weight: 3,
    source: COMMON,
    when: (f) => isCrack(f, 'sharp') && glazeFiring(f),
    says: () => 'A crack open on heating would have filled with melting glaze; this one is sharp.',
  },
  {
    id: 'crack-may-be-heating',
    phase: 'quartz-heating',
    stance: 'for',
    weight: 1,
    source: COMMON,
    opens: true,
    when: (f) => f.seen.kind === 'crack',
    says: () => 'A crack in firing opens either on heating or on cooling; the look of its edge tells which.',
  },
  {
    id: 'crack-may-be-quartz-cooling',
    phase: 'quartz-cooling',
    stance: 'for',
    weight: 1,
    source: COMMON,
    opens: true,
    when: (f) => f.seen.kind === 'crack',
    says: () => 'Cracks that open on cooling mostly open at one of the two silica inversions; quartz, near 573 °C, is one.',
  },
  {
    id: 'crack-may-be-cristobalite',
    phase: 'cristobalite-cooling',
    stance: 'for',
    weight: 1,
    source: COMMON,
    opens: true,
    when: (f) => f.seen.kind === 'crack',
    says: () => 'Cracks that open on cooling mostly open at one of the two silica inversions; cristobalite, near 220 °C, is the other.',
  },
  {
    id: 'bloat-overfire',
    phase: 'peak',
    stance: 'for',
    weight: 2,
    source: COMMON,
    opens: true,
    when: (f) => f.seen.kind === 'bloating',
    says: () => 'Bloating is gas trapped in a body that has started to melt: fired past its cone.',
  },
  {
    id: 'bloat-burnout',
    phase: 'burnout',
    stance: 'for',
    weight: 2,
    source: COMMON,
    opens: true,
    when: (f) => f.seen.kind === 'bloating' || f.seen.kind === 'black-core',
    says: (f) =>
      f.seen.kind === 'black-core'
        ? 'A black core is carbon left in the body: the burnout (about 300–870 °C) went too fast or short of air, and the surface sealed over it.'
        : 'Carbon and sulfur not burnt out before the surface sealed gas and bloat the body later.',
  },
  {
    id: 'slump-overfire',
    phase: 'peak',
    stance: 'for',
    weight: 3,
    source: COMMON,
    opens: true,
    when: (f) => f.seen.kind === 'slumping',
    says: () => 'Slumping is a body soft with too much melt: too hot for the body, or held too long at peak.',
  },
  {
    id: 'run-or-stuck-peak',
    phase: 'peak',
    stance: 'for',
    weight: 3,
    source: COMMON,
    opens: true,
    when: (f) => f.seen.kind === 'glaze-run' || f.seen.kind === 'stuck',
    says: () => 'Glaze that runs or sticks ware to the shelf melted more than it should: a glaze past its cone, too thick, or on the foot.',
  },

  // The ware's own check.
  {
    id: 'ware-wet',
    phase: 'water-smoking',
    stance: 'for',
    weight: 2,
    source: COMMON,
    when: (f) => f.codes.has('wet-greenware') || anyPiece(f, (p) => p.state === 'greenware' && p.boneDry === false),
    says: () => 'The ware was declared not bone dry: the water left in it is what turns to steam.',
  },
  {
    id: 'ware-thick',
    phase: 'water-smoking',
    stance: 'for',
    weight: 1,
    source: COMMON,
    when: (f) => f.codes.has('solid-too-thick') || f.codes.has('thick-wall-preheat'),
    says: () => 'The walls are thick for the firing: water deep in them leaves slowly and bursts a wall climbed too fast.',
  },
  {
    id: 'ware-closed-no-vent',
    phase: 'water-smoking',
    stance: 'for',
    weight: 2,
    source: COMMON,
    when: (f) => f.codes.has('closed-no-vent') || anyPiece(f, (p) => p.form === 'closed' && p.ventHole === false),
    says: () => 'A closed form without a vent hole holds its steam and air until the wall gives way.',
  },
  {
    id: 'ware-already-fired',
    phase: 'water-smoking',
    stance: 'against',
    weight: 1,
    source: COMMON,
    when: (f) => f.pieces.length > 0 && f.pieces.every((p) => p.state !== 'greenware'),
    says: () => 'The ware had been bisque fired, and bisque holds little water unless it got wet before loading.',
  },
  {
    id: 'ware-thick-uneven-heating',
    phase: 'quartz-heating',
    stance: 'for',
    weight: 1,
    source: COMMON,
    when: (f) => f.codes.has('thick-wall-preheat') || f.codes.has('solid-too-thick'),
    says: () => 'Thick or uneven walls heat unevenly, and the quartz in them grows at different times across the wall.',
  },
  {
    id: 'ware-thick-cooling',
    phase: 'quartz-cooling',
    stance: 'for',
    weight: 1,
    source: COMMON,
    when: (f) => wareAsksForSlowCooling(f.pieces),
    says: () => 'Thick walls cool unevenly; they ask for a slow cool through the inversions.',
  },
  {
    id: 'body-free-silica',
    phase: 'cristobalite-cooling',
    stance: 'for',
    weight: 1,
    source: COMMON,
    when: (f) => coneIndex(f.firing.cone) >= coneIndex('6') && anyPiece(f, (p) => HIGH_FIRE_BODIES.includes(p.clay.body)),
    says: (f) =>
      `Free silica in a ${f.pieces.find((p) => HIGH_FIRE_BODIES.includes(p.clay.body))!.clay.body} body turns partly to cristobalite in a long firing to cone ${formatCone(f.firing.cone)}, which shrinks sharply near 220 °C.`,
  },
  {
    id: 'body-past-its-cone',
    phase: 'peak',
    stance: 'for',
    weight: 2,
    source: COMMON,
    when: (f) => f.codes.has('clay-overfire') || anyPiece(f, (p) => coneIndex(f.firing.cone) > coneIndex(p.clay.maxCone)),
    says: (f) => `The body is rated to a cone below the firing's cone ${formatCone(f.firing.cone)}.`,
  },
  {
    id: 'glaze-against-cone',
    phase: 'peak',
    stance: 'for',
    weight: 2,
    source: COMMON,
    when: (f) =>
      f.codes.has('glaze-cone-mismatch') ||
      anyPiece(f, (p) => p.glaze !== undefined && coneIndex(f.firing.cone) > coneIndex(p.glaze.maxCone)),
    says: (f) => `The glaze is rated to a cone below the firing's cone ${formatCone(f.firing.cone)}.`,
  },
  {
    id: 'glaze-runny-or-on-foot',
    phase: 'peak',
    stance: 'for',
    weight: 1,
    source: COMMON,
    when: (f) =>
      (f.seen.kind === 'glaze-run' || f.seen.kind === 'stuck') &&
      (f.codes.has('glaze-on-foot') ||
        f.codes.has('runny-glaze-tray') ||
        anyPiece(f, (p) => p.glaze?.onFoot === true || p.glaze?.runny === true)),
    says: () => 'The glaze was declared runny or on the foot, which is how a run reaches the shelf.',
  },

  // The logged curve.
  fastThrough('water-smoking'),
  fastThrough('burnout'),
  fastThrough('quartz-heating'),
  fastThrough('quartz-cooling'),
  fastThrough('cristobalite-cooling'),
  steadyThrough('water-smoking'),
  steadyThrough('burnout'),
  steadyThrough('quartz-heating'),
  steadyThrough('quartz-cooling'),
  steadyThrough('cristobalite-cooling'),
  {
    id: 'log-overfired',
    phase: 'peak',
    stance: 'for',
    weight: 3,
    source: 'cone heat work fitted to the Orton chart (shared/firing/heatwork.ts)',
    when: (f) => f.loggedCone != null && coneIndex(f.loggedCone) > coneIndex(f.firing.cone) + 1,
    says: (f) =>
      `The logged curve did the heat work of cone ${formatCone(f.loggedCone!)}, past the planned cone ${formatCone(f.firing.cone)}.`,
  },
  {
    id: 'log-reached-planned-cone',
    phase: 'peak',
    stance: 'against',
    weight: 1,
    source: 'cone heat work fitted to the Orton chart (shared/firing/heatwork.ts)',
    when: (f) => f.loggedCone != null && coneIndex(f.loggedCone) <= coneIndex(f.firing.cone) + 1,
    says: (f) => `The logged curve did the heat work of cone ${formatCone(f.loggedCone!)}, as planned.`,
  },
]

/** What to change next time, for the potter and for the studio's schedule, by phase (common practice). */
export const PHASE_ADVICE: Record<IncidentPhase, { potter: string[]; studio: string[] }> = {
  'water-smoking': {
    potter: [
      'Bring ware bone dry: cool to the cheek, an even light colour, and a few days longer for thick pieces.',
      'Hollow out solids thicker than about 2 cm (¾ in) and give every closed form a vent hole.',
    ],
    studio: [
      'Candle below boiling (about 90 °C) until the ware is dry through, longer for thick walls.',
      'Climb slowly to about 200 °C (around 50 °C/h for thick ware) before the main ramp.',
    ],
  },
  burnout: {
    potter: ['Tell the studio about bodies high in carbon or sulfur (some fireclays and dark bodies) and about added organics.'],
    studio: [
      'Slow the climb between about 300 and 870 °C and keep the kiln in oxidation with the vents open until burnout is done.',
      'Start body reduction only after the burnout in gas and wood firings.',
    ],
  },
  'quartz-heating': {
    potter: ['Keep walls even; join thick and thin parts gradually.'],
    studio: ['Slow the climb through 550–600 °C (about 100 °C/h or slower for thick ware).'],
  },
  peak: {
    potter: [
      'Choose a body and glaze rated for the firing cone, and test the glaze at this cone and atmosphere first.',
      'Wipe glaze off the foot and up to about 6 mm (¼ in); set runny glazes on a cookie or tray.',
    ],
    studio: [
      'Check the peak with witness cones at several positions and compare them with the logged heat work.',
      'Shorten the soak or lower the peak where the witness cones went over.',
    ],
  },
  'quartz-cooling': {
    potter: ['Keep walls even, and avoid thick bases under thin walls.'],
    studio: ['Cool slowly through 600–540 °C and keep the kiln shut: no peeking or opened bungs in that band.'],
  },
  'cristobalite-cooling': {
    potter: ['For ware that dunts in long high firings, ask your supplier for a body with less free silica.'],
    studio: ['Cool slowly through 250–190 °C and do not open the kiln until it is below about 100 °C, ware handled at 50 °C.'],
  },
}

export type DiagnosisConfidence = 'high' | 'medium' | 'low'

export interface PhaseCandidate {
  phase: IncidentPhase
  label: string
  score: number
  for: string[]
  against: string[]
  /** Rule ids that fired, for the record and the tests. */
  rules: string[]
}

export interface Diagnosis {
  /** The likeliest phase; null when nothing seen points anywhere. */
  phase: IncidentPhase | null
  label: string | null
  confidence: DiagnosisConfidence
  /** Why the likeliest phase was chosen. */
  reasons: string[]
  /** What to change next time, each for the potter or the studio. */
  advice: { for: 'potter' | 'studio'; text: string }[]
  /** Every phase the observation opened, best first, with the evidence for and against. */
  candidates: PhaseCandidate[]
  /** The stretches of the log that went faster than planned through a critical zone. */
  curveFlags: CurveFlag[]
}

/** The critical zones a curve passes through in the zone's own direction. */
export function zonesLogged(readings: readonly CurvePoint[]): Set<CriticalZoneId> {
  const logged = new Set<CriticalZoneId>()
  for (let i = 1; i < readings.length; i++) {
    const from = readings[i - 1]
    const to = readings[i]
    if (to.minute <= from.minute || to.tempC === from.tempC) continue
    const direction = to.tempC > from.tempC ? 'heating' : 'cooling'
    const low = Math.min(from.tempC, to.tempC)
    const high = Math.max(from.tempC, to.tempC)
    for (const zone of CRITICAL_ZONES) {
      if (zone.direction === direction && high > zone.lowC && low < zone.highC) logged.add(zone.id)
    }
  }
  return logged
}

/** Works out the facts the rules read. */
export function incidentFacts(seen: IncidentObservation, context: IncidentContext): IncidentFacts {
  const findings = context.findings ?? (context.kiln ? checkWare(context.kiln, { ...context.firing }, context.pieces).findings : [])
  const readings = context.readings ?? []
  const flags = context.plan && readings.length > 1 ? curveFlags(context.plan, readings) : []
  return {
    seen,
    firing: context.firing,
    pieces: context.pieces,
    codes: new Set(findings.map((finding) => finding.code)),
    flags,
    logged: zonesLogged(readings),
    loggedCone: readings.length > 1 ? coneFromCurve(readings).cone : undefined,
  }
}

/**
 * The likely phase of a failure and why. The observation opens the candidate phases; the ware's check
 * and the logged curve add and take weight. Confidence is high when the winner leads by a clear margin
 * and the log itself speaks for it, medium when it leads clearly, low when two phases are close.
 */
export function diagnose(seen: IncidentObservation, context: IncidentContext): Diagnosis {
  const facts = incidentFacts(seen, context)
  const byPhase = new Map<IncidentPhase, PhaseCandidate>()
  const open = new Set<IncidentPhase>()
  for (const rule of DIAGNOSIS_RULES) if (rule.opens && rule.stance === 'for' && rule.when(facts)) open.add(rule.phase)
  for (const rule of DIAGNOSIS_RULES) {
    if (!open.has(rule.phase) || !rule.when(facts)) continue
    const candidate = byPhase.get(rule.phase) ?? {
      phase: rule.phase,
      label: PHASE_LABELS[rule.phase],
      score: 0,
      for: [],
      against: [],
      rules: [],
    }
    candidate.score += rule.stance === 'for' ? rule.weight : -rule.weight
    candidate[rule.stance].push(rule.says(facts))
    candidate.rules.push(rule.id)
    byPhase.set(rule.phase, candidate)
  }
  const candidates = [...byPhase.values()].sort(
    (a, b) => b.score - a.score || INCIDENT_PHASES.indexOf(a.phase) - INCIDENT_PHASES.indexOf(b.phase),
  )
  const best = candidates[0]
  if (!best || best.score <= 0) {
    return { phase: null, label: null, confidence: 'low', reasons: [], advice: [], candidates, curveFlags: [...facts.flags] }
  }
  const margin = best.score - Math.max(0, candidates[1]?.score ?? 0)
  const logSpeaks = best.rules.some((id) => id.startsWith('log-fast-') || id === 'log-overfired')
  const confidence: DiagnosisConfidence = margin >= 3 && logSpeaks ? 'high' : margin >= 2 ? 'medium' : 'low'
  const advice = [
    ...PHASE_ADVICE[best.phase].potter.map((text) => ({ for: 'potter' as const, text })),
    ...PHASE_ADVICE[best.phase].studio.map((text) => ({ for: 'studio' as const, text })),
  ]
  return {
    phase: best.phase,
    label: best.label,
    confidence,
    reasons: best.for,
    advice,
    candidates,
    curveFlags: [...facts.flags],
  }
}
