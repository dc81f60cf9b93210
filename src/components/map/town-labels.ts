import type { TownLabel } from '../../../shared/schemas/places'

// Which town names fit on the map: biggest towns first, each name kept only where it overlaps no
// name already kept and lies wholly inside the map. Pure, over screen positions the map gives.

export interface PlacedTown {
  town: TownLabel
  x: number
  y: number
}

/** The box a name takes on screen: about 7 px a letter at 12 px, a little air around it. */
export function labelBox(name: string, x: number, y: number) {
  const halfWidth = (name.length * 7 + 8) / 2
  return { left: x - halfWidth, right: x + halfWidth, top: y - 9, bottom: y + 9 }
}

export function placeTownLabels(
  towns: readonly TownLabel[],
  toScreen: (town: TownLabel) => { x: number; y: number },
  size: { width: number; height: number },
  max = 40,
): PlacedTown[] {
  const kept: (PlacedTown & { box: ReturnType<typeof labelBox> })[] = []
  const bySize = [...towns].sort((a, b) => b.postalCount - a.postalCount || a.name.localeCompare(b.name))
  for (const town of bySize) {
    if (kept.length >= max) break
    const { x, y } = toScreen(town)
    const box = labelBox(town.name, x, y)
    if (box.left < 0 || box.top < 0 || box.right > size.width || box.bottom > size.height) continue
    if (kept.some(({ box: b }) => box.left < b.right && b.left < box.right && box.top < b.bottom && b.top < box.bottom)) continue
    kept.push({ town, x, y, box })
  }
  return kept.map(({ town, x, y }) => ({ town, x, y }))
}
