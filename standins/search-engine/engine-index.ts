// One index of the stand-in: its documents in memory, facet columns for the filterable
// attributes, a latitude-ordered geo index and the MiniSearch text index. Nothing is written to
// disk; the app rebuilds the index from PostgreSQL when it starts.

import { DocSet } from './doc-set'
import {
  documentIdKey,
  flattenDocument,
  geoCoordinate,
  patternCovers,
  readPath,
  type FlatDocument,
  type JsonObject,
} from './document-fields'
import { engineErrors } from './errors'
import { FacetColumn } from './facet-index'
import type { FilterContext } from './filter-evaluate'
import { GeoIndex } from './geo'
import { defaultSettings, type IndexSettings } from './settings'
import { TextIndex } from './text-index'

export interface StoredDocument {
  internalId: number
  externalId: string
  body: JsonObject
  flat: FlatDocument
}

export class EngineIndex {
  primaryKey: string | null
  readonly createdAt = new Date()
  updatedAt = new Date()
  settings: IndexSettings = defaultSettings()
  readonly geo = new GeoIndex()
  readonly text: TextIndex

  private readonly byExternal = new Map<string, StoredDocument>()
  /** Insertion order equals internal-id order: ids only grow and replacements keep theirs. */
  private readonly byInternal = new Map<number, StoredDocument>()
  private nextInternalId = 0
  private columns = new Map<string, FacetColumn>()
  private coverage = new Map<string, boolean>()
  private allDocuments: DocSet | null = null
  /** Condition sets for this revision of the documents and settings (see filter-evaluate.ts). */
  private conditionCache = new Map<string, DocSet>()
  private readonly topLevelFieldCounts = new Map<string, number>()

  constructor(
    readonly uid: string,
    primaryKey: string | null,
  ) {
    this.primaryKey = primaryKey
    this.text = new TextIndex(
      () => this.settings,
      () => [...this.byInternal.values()].map((document) => [document.internalId, document.body] as [number, JsonObject]),
      () => [...this.topLevelFieldCounts.keys()],
    )
  }

  get documentCount(): number {
    return this.byExternal.size
  }

  get capacity(): number {
    return this.nextInternalId
  }

  documents(): IterableIterator<StoredDocument> {
    return this.byInternal.values()
  }

  documentByExternalId(id: string): StoredDocument | undefined {
    return this.byExternal.get(id)
  }

  documentByInternalId(id: number): StoredDocument | undefined {
    return this.byInternal.get(id)
  }

  all(): DocSet {
    this.allDocuments ??= DocSet.of(this.capacity, this.byInternal.keys())
    return this.allDocuments
  }

  /** The facet column of an attribute, when some document holds it and it is filterable. */
  column(attribute: string): FacetColumn | undefined {
    return this.columns.get(attribute)
  }

  /** Dotted paths that hold facet values in at least one document. */
  facetedPaths(): string[] {
    return [...this.columns.keys()]
  }

  /** Top-level attribute names seen in the documents, in first-seen order. */
  fieldNames(): string[] {
    return [...this.topLevelFieldCounts.keys()]
  }

  filterContext(errorCode: string): FilterContext {
    return {
      indexUid: this.uid,
      settings: this.settings,
      capacity: this.capacity,
      all: () => this.all(),
      column: (attribute) => this.column(attribute),
      geo: this.geo,
      errorCode,
      conditionCache: this.conditionCache,
    }
  }

  private isFaceted(path: string): boolean {
    let covered = this.coverage.get(path)
    if (covered === undefined) {
      covered = this.settings.filterableAttributes.some((rule) =>
        (typeof rule === 'string' ? [rule] : rule.attributePatterns).some((pattern) => patternCovers(pattern, path)),
      )
      this.coverage.set(path, covered)
    }
    return covered
  }

  private indexFacets(document: StoredDocument, add: boolean): void {
    for (const [path, field] of document.flat) {
      if (!this.isFaceted(path)) continue
      let column = this.columns.get(path)
      if (!column) {
        if (!add) continue
        column = new FacetColumn()
        this.columns.set(path, column)
      }
      if (add) column.add(document.internalId, field)
      else {
        column.remove(document.internalId, field)
        if (column.isEmpty()) this.columns.delete(path)
      }
    }
  }

  private indexGeo(document: StoredDocument): void {
    const geo = document.body._geo
    const lat = geo && typeof geo === 'object' ? geoCoordinate((geo as JsonObject).lat) : null
    const lng = geo && typeof geo === 'object' ? geoCoordinate((geo as JsonObject).lng) : null
    if (lat !== null && lng !== null) this.geo.set(document.internalId, lat, lng)
    else this.geo.delete(document.internalId)
  }

  private countFields(body: JsonObject, delta: 1 | -1): void {
    for (const key of Object.keys(body)) {
      const count = (this.topLevelFieldCounts.get(key) ?? 0) + delta
      if (count > 0) this.topLevelFieldCounts.set(key, count)
      else this.topLevelFieldCounts.delete(key)
    }
  }

  /** Stores a validated document under its external id, replacing any previous version. */
  putDocument(externalId: string, body: JsonObject): void {
    this.conditionCache.clear()
    const previous = this.byExternal.get(externalId)
    if (previous) {
      this.indexFacets(previous, false)
      this.countFields(previous.body, -1)
    }
    const internalId = previous?.internalId ?? this.nextInternalId++
    const document: StoredDocument = { internalId, externalId, body, flat: flattenDocument(body) }
    this.byExternal.set(externalId, document)
    this.byInternal.set(internalId, document)
    this.countFields(body, 1)
    this.indexFacets(document, true)
    this.indexGeo(document)
    this.text.upsert(internalId, body)
    if (!previous) this.allDocuments = null
  }

  deleteDocument(externalId: string): boolean {
    this.conditionCache.clear()
    const document = this.byExternal.get(externalId)
    if (!document) return false
    this.indexFacets(document, false)
    this.countFields(document.body, -1)
    this.geo.delete(document.internalId)
    this.text.remove(document.internalId)
    this.byExternal.delete(externalId)
    this.byInternal.delete(document.internalId)
    this.allDocuments = null
    return true
  }

  clear(): number {
    this.conditionCache.clear()
    const count = this.byExternal.size
    for (const id of [...this.byExternal.keys()]) this.deleteDocument(id)
    return count
  }

  /** Installs new settings and rebuilds whatever depends on them. */
  replaceSettings(settings: IndexSettings): void {
    this.conditionCache.clear()
    const facetsChanged = JSON.stringify(settings.filterableAttributes) !== JSON.stringify(this.settings.filterableAttributes)
    this.settings = settings
    if (facetsChanged) {
      this.coverage = new Map()
      this.columns = new Map()
      for (const document of this.byInternal.values()) this.indexFacets(document, true)
    }
    this.text.invalidate()
  }

  /** The external id of a document body under this index's primary key, validated as the engine does. */
  externalIdOf(body: JsonObject, primaryKey: string): string {
    const value = readPath(body, primaryKey)
    if (value === undefined) throw engineErrors.missingDocumentId(primaryKey, body)
    const key = documentIdKey(value)
    if (key === null) throw engineErrors.invalidDocumentId(value)
    return key
  }
}
