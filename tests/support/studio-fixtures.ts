import type { HttpSession } from './http-client'

/** An electric top-loader: 28 in across, 27 in tall, cone 022–10, oxidation. */
export const electricKiln = {
  name: 'Test electric',
  kind: 'electric',
  atmospheres: ['oxidation'],
  interior: { shape: 'round', diameterMm: 711, heightMm: 686 },
  minCone: '022',
  maxCone: '10',
  maxTempC: 1300,
  maxRampCPerHour: 300,
  preheatHold: true,
  controlledCooling: true,
  shelfCount: 6,
  shelfWidthMm: 660,
  shelfDepthMm: 660,
}

export const volumePriceList = {
  currency: 'USD',
  model: 'volume',
  centsPerCubicInch: 4,
  minimumPerPieceCents: 300,
  deposit: { percent: 25 },
}

const days = (n: number) => new Date(Date.now() + n * 24 * 3600_000).toISOString()

export function firingBody(overrides: Record<string, unknown> = {}) {
  return {
    kind: 'glaze',
    cone: '6',
    atmosphere: 'oxidation',
    dropOffBy: days(5),
    firingDate: days(7),
    readyBy: days(10),
    ...overrides,
  }
}

/** A published studio with one kiln (with a price list) and one firing, owned by `owner`. */
export async function publishedStudio(owner: HttpSession, name = 'Matrix Pottery') {
  const studio = await owner.post('/api/studios', { name, postalCode: '97214' })
  if (studio.status !== 201) throw new Error(`studio: ${studio.status} ${JSON.stringify(studio.body)}`)
  await owner.patch(`/api/studios/${studio.body.id}`, { published: true })
  const kiln = await owner.post(`/api/studios/${studio.body.id}/kilns`, electricKiln)
  if (kiln.status !== 201) throw new Error(`kiln: ${kiln.status} ${JSON.stringify(kiln.body)}`)
  await owner.put(`/api/kilns/${kiln.body.id}/price-list`, volumePriceList)
  const firing = await owner.post(`/api/kilns/${kiln.body.id}/firings`, firingBody())
  if (firing.status !== 201) throw new Error(`firing: ${firing.status} ${JSON.stringify(firing.body)}`)
  return { studioId: studio.body.id as string, kilnId: kiln.body.id as string, firingId: firing.body.firings[0].id as string }
}
