// A stored photo as the API describes it (server/services/photos.ts photoJson): re-encoded, without
// metadata, served only to those who may see its request.

export type PhotoKind = 'ware' | 'check-in' | 'result' | 'refusal' | 'incident'

export interface PhotoJson {
  id: string
  kind: PhotoKind
  width: number
  height: number
  /** Shown on the studio's public page (result photos only, when the potter opts in). */
  public: boolean
  /** The one piece it shows, when it shows one. */
  pieceId: string | null
  /** Large uploads are prepared after the upload; the image is served once this is false. */
  processing: boolean
  url: string
  thumbUrl: string
  at: string
}
