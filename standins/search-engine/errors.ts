// Errors in the engine's wire shape `{message, code, type, link}` with its HTTP status codes.
// Messages follow the engine's source (meilisearch-types error.rs, milli error.rs) word for word
// where the stand-in raises the same condition.

export type EngineErrorType = 'invalid_request' | 'internal' | 'auth' | 'system'

export interface EngineErrorBody {
  message: string
  code: string
  type: EngineErrorType
  link: string
}

export class EngineError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly type: EngineErrorType = 'invalid_request',
  ) {
    super(message)
    this.name = 'EngineError'
  }

  toBody(): EngineErrorBody {
    return { message: this.message, code: this.code, type: this.type, link: `https://docs.meilisearch.com/errors#${this.code}` }
  }
}

const badRequest = (code: string, message: string): EngineError => new EngineError(400, code, message)

export const engineErrors = {
  missingAuthorizationHeader: () =>
    new EngineError(
      401,
      'missing_authorization_header',
      'The Authorization header is missing. It must use the bearer authorization method.',
      'auth',
    ),
  invalidApiKey: () => new EngineError(403, 'invalid_api_key', 'The provided API key is invalid.', 'auth'),
  indexNotFound: (uid: string) => new EngineError(404, 'index_not_found', `Index \`${uid}\` not found.`),
  indexAlreadyExists: (uid: string) => new EngineError(409, 'index_already_exists', `Index \`${uid}\` already exists.`),
  invalidIndexUid: (uid: string) =>
    badRequest(
      'invalid_index_uid',
      `\`${uid}\` is not a valid index uid. Index uid can be an integer or a string containing only alphanumeric characters, hyphens (-) and underscores (_), and can not be more than 400 bytes.`,
    ),
  missingIndexUid: () => badRequest('missing_index_uid', 'Missing field `uid`'),
  documentNotFound: (id: string) => new EngineError(404, 'document_not_found', `Document \`${id}\` not found.`),
  taskNotFound: (uid: string) => new EngineError(404, 'task_not_found', `Task \`${uid}\` not found.`),
  invalidDocumentId: (value: unknown) =>
    badRequest(
      'invalid_document_id',
      `Document identifier \`${JSON.stringify(value)}\` is invalid. A document identifier can be of type integer or string, only composed of alphanumeric characters (a-z A-Z 0-9), hyphens (-) and underscores (_), and can not be more than 511 bytes.`,
    ),
  missingDocumentId: (primaryKey: string, document: unknown) =>
    badRequest('missing_document_id', `Document doesn't have a \`${primaryKey}\` attribute: \`${JSON.stringify(document)}\`.`),
  noPrimaryKeyCandidate: () =>
    badRequest(
      'index_primary_key_no_candidate_found',
      'The primary key inference failed as the engine did not find any field ending with `id` in its name. Please specify the primary key manually using the `primaryKey` query parameter.',
    ),
  multiplePrimaryKeyCandidates: (candidates: string[]) =>
    badRequest(
      'index_primary_key_multiple_candidates_found',
      `The primary key inference failed as the engine found ${candidates.length} fields ending with \`id\` in their names: '${candidates[0]}' and '${candidates[1]}'. Please specify the primary key manually using the \`primaryKey\` query parameter.`,
    ),
  primaryKeyAlreadyExists: (primaryKey: string) =>
    badRequest('index_primary_key_already_exists', `Index already has a primary key: \`${primaryKey}\`.`),
  invalidGeoField: (message: string) => badRequest('invalid_document_geo_field', message),
  malformedPayload: (detail: string) => badRequest('malformed_payload', `The json payload provided is malformed. \`${detail}\`.`),
  missingPayload: () => badRequest('missing_payload', 'A json payload is missing.'),
  invalidContentType: (contentType: string) =>
    new EngineError(
      415,
      'invalid_content_type',
      `The Content-Type \`${contentType}\` is invalid. Accepted values for the Content-Type header are: \`application/json\`, \`application/x-ndjson\``,
    ),
  badRequest: (message: string) => badRequest('bad_request', message),
  invalid: (code: string, message: string) => badRequest(code, message),
  featureNotEnabled: (message: string) => badRequest('feature_not_enabled', message),
}
