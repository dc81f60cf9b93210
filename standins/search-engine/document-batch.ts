// Applying a document addition task: primary key choice and inference, id and `_geo` checks,
// replace (POST) or merge (PUT) semantics. A batch with one bad document fails as a whole and
// changes nothing, as in the engine.

import { geoCoordinate, type JsonObject } from './document-fields'
import { engineErrors } from './errors'
import type { EngineIndex } from './engine-index'

/** The engine guesses the primary key from the first document's fields ending in "id". */
export function inferPrimaryKey(first: JsonObject | undefined): string {
  const candidates = first ? Object.keys(first).filter((key) => key.toLowerCase().endsWith('id')) : []
  if (candidates.length === 0) throw engineErrors.noPrimaryKeyCandidate()
  if (candidates.length > 1) throw engineErrors.multiplePrimaryKeyCandidates(candidates)
  return candidates[0]
}

/** milli `validate_geo_from_json`, with its `GeoError` messages. */
export function validateGeo(document: JsonObject, idValue: unknown): void {
  if (!('_geo' in document) || document._geo === null) return
  const id = JSON.stringify(idValue)
  const geo = document._geo
  if (typeof geo !== 'object' || Array.isArray(geo)) {
    throw engineErrors.invalidGeoField(
      `The \`_geo\` field in the document with the id: \`${id}\` is not an object. Was expecting an object with the \`_geo.lat\` and \`_geo.lng\` fields but instead got \`${JSON.stringify(geo)}\`.`,
    )
  }
  const { lat, lng, ...extra } = geo as JsonObject
  if (Object.keys(extra).length > 0) {
    throw engineErrors.invalidGeoField(
      `The \`_geo\` field in the document with the id: \`${id}\` contains the following unexpected fields: \`${JSON.stringify(extra)}\`.`,
    )
  }
  if (lat === undefined && lng === undefined) {
    throw engineErrors.invalidGeoField(
      `Could not find latitude nor longitude in the document with the id: \`${id}\`. Was expecting \`_geo.lat\` and \`_geo.lng\` fields.`,
    )
  }
  if (lat === undefined)
    throw engineErrors.invalidGeoField(
      `Could not find latitude in the document with the id: \`${id}\`. Was expecting a \`_geo.lat\` field.`,
    )
  if (lng === undefined)
    throw engineErrors.invalidGeoField(
      `Could not find longitude in the document with the id: \`${id}\`. Was expecting a \`_geo.lng\` field.`,
    )
  const badLat = geoCoordinate(lat) === null
  const badLng = geoCoordinate(lng) === null
  if (badLat && badLng) {
    throw engineErrors.invalidGeoField(
      `Could not parse latitude nor longitude in the document with the id: \`${id}\`. Was expecting finite numbers but instead got \`${JSON.stringify(lat)}\` and \`${JSON.stringify(lng)}\`.`,
    )
  }
  if (badLat)
    throw engineErrors.invalidGeoField(
      `Could not parse latitude in the document with the id: \`${id}\`. Was expecting a finite number but instead got \`${JSON.stringify(lat)}\`.`,
    )
  if (badLng)
    throw engineErrors.invalidGeoField(
      `Could not parse longitude in the document with the id: \`${id}\`. Was expecting a finite number but instead got \`${JSON.stringify(lng)}\`.`,
    )
}

export type AdditionMethod = 'replace' | 'update'

/** Validates the whole batch, then stores it. Returns the number of documents indexed. */
export function applyDocumentBatch(
  index: EngineIndex,
  documents: JsonObject[],
  method: AdditionMethod,
  primaryKeyParameter: string | null,
): { primaryKey: string | null; indexed: number } {
  if (documents.length === 0) return { primaryKey: index.primaryKey, indexed: 0 }
  let primaryKey = index.primaryKey
  if (primaryKeyParameter !== null && primaryKey !== null && primaryKeyParameter !== primaryKey && index.documentCount > 0) {
    throw engineErrors.primaryKeyAlreadyExists(primaryKey)
  }
  if (primaryKeyParameter !== null && index.documentCount === 0) primaryKey = primaryKeyParameter
  primaryKey ??= inferPrimaryKey(documents[0])

  const batch = new Map<string, JsonObject>()
  for (const document of documents) {
    const externalId = index.externalIdOf(document, primaryKey)
    validateGeo(document, document[primaryKey] ?? externalId)
    const earlier = batch.get(externalId)
    batch.set(externalId, method === 'update' && earlier ? { ...earlier, ...document } : document)
  }

  index.primaryKey = primaryKey
  for (const [externalId, document] of batch) {
    const existing = index.documentByExternalId(externalId)
    index.putDocument(externalId, method === 'update' && existing ? { ...existing.body, ...document } : document)
  }
  index.updatedAt = new Date()
  return { primaryKey, indexed: documents.length }
}
