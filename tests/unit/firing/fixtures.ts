// Ware and kilns for the firing tests: a load that passes every check, so each test changes one thing.

import type { Firing, Kiln, Piece } from '../../../shared/firing/check'

/** A mid-size electric kiln with a controller: round, 580 mm across, 690 mm deep inside. */
export function electricKiln(overrides: Partial<Kiln> = {}): Kiln {
  return {
    kind: 'electric',
    atmospheres: ['oxidation'],
    interior: { shape: 'round', diameterMm: 580, heightMm: 690 },
    minCone: '022',
    maxCone: '10',
    maxTempC: 1300,
    maxRampCPerHour: 300,
    preheatHold: true,
    controlledCooling: true,
    ...overrides,
  }
}

export function glazeFiring(overrides: Partial<Firing> = {}): Firing {
  return { kind: 'glaze', cone: '6', atmosphere: 'oxidation', ...overrides }
}

export function bisqueFiring(overrides: Partial<Firing> = {}): Firing {
  return { kind: 'bisque', cone: '04', atmosphere: 'oxidation', ...overrides }
}

/** A bisqued, glazed cone 6 stoneware mug. */
export function mug(overrides: Partial<Piece> = {}): Piece {
  return {
    label: 'Mug',
    quantity: 1,
    heightMm: 110,
    widthMm: 90,
    depthMm: 90,
    round: true,
    wallThicknessMm: 6,
    clay: { body: 'stoneware', minCone: '5', maxCone: '7' },
    state: 'bisque',
    glaze: { minCone: '5', maxCone: '7' },
    ...overrides,
  }
}

/** A bone-dry, unglazed stoneware bowl for the bisque kiln. */
export function greenBowl(overrides: Partial<Piece> = {}): Piece {
  return {
    label: 'Bowl',
    quantity: 1,
    heightMm: 90,
    widthMm: 180,
    depthMm: 180,
    round: true,
    wallThicknessMm: 7,
    clay: { body: 'stoneware', minCone: '5', maxCone: '7' },
    state: 'greenware',
    boneDry: true,
    ...overrides,
  }
}
