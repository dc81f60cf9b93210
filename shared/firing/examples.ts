// Reference pieces for "example prices": the same pieces on every studio's page and in search, so
// potters can compare prices across studios and pricing models.
import type { Piece } from './check'

/** A 12 oz mug: about 4 in tall, 3½ in across the body plus the handle. */
export const EXAMPLE_MUG: Piece = {
  label: 'Mug (4 × 3½ × 4½ in)',
  quantity: 1,
  heightMm: 102,
  widthMm: 89,
  depthMm: 114,
  wallThicknessMm: 6,
  clay: { body: 'stoneware', minCone: '5', maxCone: '10' },
  state: 'bisque',
  boneDry: true,
  glaze: { minCone: '5', maxCone: '10' },
}

/** A dinner plate, 10½ in across. */
export const EXAMPLE_PLATE: Piece = {
  label: 'Dinner plate (10½ in)',
  quantity: 1,
  heightMm: 25,
  widthMm: 267,
  depthMm: 267,
  round: true,
  wallThicknessMm: 8,
  clay: { body: 'stoneware', minCone: '5', maxCone: '10' },
  state: 'bisque',
  boneDry: true,
  glaze: { minCone: '5', maxCone: '10' },
}

export const EXAMPLE_PIECES: readonly Piece[] = [EXAMPLE_MUG, EXAMPLE_PLATE]
