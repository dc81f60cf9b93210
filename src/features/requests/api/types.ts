// The requests API's shapes come from shared/api (declared once for the server and the client); the
// few here are what the compose page reads of the firing's studio, and the list filter.
import type { PublicStudioJson } from '../../../../shared/api/studios'
import type { PriceList } from '../../../../shared/firing/quote'

export type {
  CheckInJson as CheckInRecord,
  CheckInOutcome,
  CounterRefundJson,
  LedgerEntryJson as LedgerEntry,
  MeasuredSize,
  PaymentJson as PaymentRecord,
  PieceOutcome,
  PotterRecordJson as PotterRecord,
  PriceJson,
  RequestMessageJson as RequestMessage,
  RequestReviewsJson as RequestReviews,
  RequestRow,
  RequestView,
  ResultsJson as ResultsRecord,
  ReviewJson as ReviewRecord,
  TimelineEntryJson as TimelineEntry,
} from '../../../../shared/api/requests'
export type { FiringJson as FiringRecord, KilnJson as KilnRecord } from '../../../../shared/api/studios'
export type { RequestAction } from '../../../../shared/workflow/policy'
export type { RequestFilter } from '../../../lib/queryKeys'

export interface PriceListAnswer {
  priceList: PriceList
}

/** The studio as a potter sees it before sending (the public side). */
export type StudioRecord = PublicStudioJson
