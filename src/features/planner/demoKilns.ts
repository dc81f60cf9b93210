// Example kilns to start the planner from. Invented, with figures typical of their kind (from
// memory, common practice): a potter can pick one and change what differs about their own. Sizes
// are whole inches (1 in = 25.4 mm), as such kilns are sold.

import type { Kiln } from '../../../shared/firing/check'

export interface DemoKiln {
  id: string
  name: string
  kiln: Kiln
}

export const DEMO_KILNS: readonly DemoKiln[] = [
  {
    id: 'electric-top-loader',
    name: 'Electric top-loader, 7 cu ft, to cone 10',
    kiln: {
      kind: 'electric',
      atmospheres: ['oxidation'],
      // 23½ in across and 27 in deep inside: about 6.8 cu ft.
      interior: { shape: 'round', diameterMm: 596.9, heightMm: 685.8 },
      minCone: '022',
      maxCone: '10',
      maxTempC: 1305,
      maxRampCPerHour: 330,
      preheatHold: true,
      controlledCooling: true,
    },
  },
  {
    id: 'gas-car-kiln',
    name: 'Gas car kiln, 42 cu ft, cone 10 reduction',
    kiln: {
      kind: 'gas',
      atmospheres: ['oxidation', 'reduction'],
      // 42 × 36 × 48 in inside.
      interior: { shape: 'box', widthMm: 1066.8, depthMm: 914.4, heightMm: 1219.2 },
      minCone: '010',
      maxCone: '11',
      maxTempC: 1320,
      maxRampCPerHour: 200,
      preheatHold: true,
      controlledCooling: false,
    },
  },
  {
    id: 'test-kiln',
    name: 'Small test kiln, 9 in box, to cone 6',
    kiln: {
      kind: 'electric',
      atmospheres: ['oxidation'],
      interior: { shape: 'box', widthMm: 228.6, depthMm: 228.6, heightMm: 228.6 },
      minCone: '022',
      maxCone: '6',
      maxTempC: 1250,
      maxRampCPerHour: 500,
      // A simple switch-controlled test kiln: it cannot hold a low preheat or slow its cooling.
      preheatHold: false,
      controlledCooling: false,
    },
  },
  {
    id: 'raku-kiln',
    name: 'Raku kiln, fibre-lined, gas, to cone 04',
    kiln: {
      kind: 'raku',
      atmospheres: ['oxidation', 'reduction'],
      interior: { shape: 'round', diameterMm: 558.8, heightMm: 609.6 },
      minCone: '022',
      maxCone: '04',
      maxTempC: 1100,
      maxRampCPerHour: 600,
      preheatHold: false,
      controlledCooling: false,
    },
  },
]

export function demoKiln(id: string): DemoKiln | undefined {
  return DEMO_KILNS.find((demo) => demo.id === id)
}
