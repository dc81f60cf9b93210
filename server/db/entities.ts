// Every entity, listed once for the data source (esbuild-based runners cannot glob decorated classes).
import { AuthToken } from '../entities/AuthToken'
import { CheckIn } from '../entities/CheckIn'
import { Claim } from '../entities/Claim'
import { KeptCard } from '../entities/KeptCard'
import { CounterRefund } from '../entities/CounterRefund'
import { Firing } from '../entities/Firing'
import { FiringEvent } from '../entities/FiringEvent'
import { FiringLog } from '../entities/FiringLog'
import { FiringRequest } from '../entities/FiringRequest'
import { Incident } from '../entities/Incident'
import { IncidentPiece } from '../entities/IncidentPiece'
import { IncidentRemedy } from '../entities/IncidentRemedy'
import { Kiln } from '../entities/Kiln'
import { LoadPlanRecord } from '../entities/LoadPlanRecord'
import { LedgerEntry } from '../entities/LedgerEntry'
import { Notice } from '../entities/Notice'
import { Payment } from '../entities/Payment'
import { Photo } from '../entities/Photo'
import { KilnPriceList } from '../entities/KilnPriceList'
import { OutboundMail } from '../entities/OutboundMail'
import { PayoutAccount } from '../entities/PayoutAccount'
import { Review } from '../entities/Review'
import { RequestEvent } from '../entities/RequestEvent'
import { RequestMessage } from '../entities/RequestMessage'
import { RequestPayout } from '../entities/RequestPayout'
import { RequestResult } from '../entities/RequestResult'
import { SearchDocument } from '../entities/SearchDocument'
import { StripeEvent } from '../entities/StripeEvent'
import { Studio } from '../entities/Studio'
import { StudioMember } from '../entities/StudioMember'
import { StudioPayout } from '../entities/StudioPayout'
import { StudioTransfer } from '../entities/StudioTransfer'
import { TransferReversal } from '../entities/TransferReversal'
import { User } from '../entities/User'
import { WarePiece } from '../entities/WarePiece'

export const entities = [
  Incident,
  IncidentPiece,
  IncidentRemedy,
  Claim,
  KeptCard,
  User,
  Studio,
  StudioMember,
  AuthToken,
  OutboundMail,
  Kiln,
  KilnPriceList,
  Firing,
  FiringRequest,
  RequestEvent,
  Review,
  SearchDocument,
  LedgerEntry,
  Payment,
  StripeEvent,
  RequestMessage,
  CheckIn,
  Photo,
  FiringLog,
  RequestResult,
  Notice,
  FiringEvent,
  CounterRefund,
  WarePiece,
  LoadPlanRecord,
  PayoutAccount,
  RequestPayout,
  StudioTransfer,
  TransferReversal,
  StudioPayout,
]
