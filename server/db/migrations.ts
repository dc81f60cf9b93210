// Every migration in the order it runs. `npm run migration:generate -- Name` writes a new file into
// ./migrations; add its class to the end of this list.
import { Foundation1796149373286 } from './migrations/1796149373286-Foundation'
import { StudiosKilnsFirings1796150510924 } from './migrations/1796150510924-StudiosKilnsFirings'
import { FiringRequests1796150607023 } from './migrations/1796150607023-FiringRequests'
import { SearchAndRatings1796151307684 } from './migrations/1796151307684-SearchAndRatings'
import { PaymentsAndMessages1796151940233 } from './migrations/1796151940233-PaymentsAndMessages'
import { DropOffToPickup1796152667537 } from './migrations/1796152667537-DropOffToPickup'
import { SearchFacetColumns1796153787338 } from './migrations/1796153787338-SearchFacetColumns'
import { SearchDocumentsNarrowRows1796158092958 } from './migrations/1796158092958-SearchDocumentsNarrowRows'
import { RequestLifecycle1796166638665 } from './migrations/1796166638665-RequestLifecycle'
import { FiringSciencePass1796167522134 } from './migrations/1796167522134-FiringSciencePass'
import { FiringKindsAndHalfCones1796167600000 } from './migrations/1796167600000-FiringKindsAndHalfCones'
import { PieceSupport1796167700000 } from './migrations/1796167700000-PieceSupport'
import { Hardening1796172202396 } from './migrations/1796172202396-Hardening'
import { ReviewsAfterPickup1796174002687 } from './migrations/1796174002687-ReviewsAfterPickup'
import { StudioPayouts1796174302372 } from './migrations/1796174302372-StudioPayouts'
import { LoadPiecesAndPlans1796175115835 } from './migrations/1796175115835-LoadPiecesAndPlans'
import { IncidentsAndClaims1796189313576 } from './migrations/1796189313576-IncidentsAndClaims'
import { IncidentRemedies1796200407089 } from './migrations/1796200407089-IncidentRemedies'
import { KeptCards1796200576439 } from './migrations/1796200576439-KeptCards'

export const migrations: (new () => unknown)[] = [
  Foundation1796149373286,
  StudiosKilnsFirings1796150510924,
  FiringRequests1796150607023,
  SearchAndRatings1796151307684,
  PaymentsAndMessages1796151940233,
  DropOffToPickup1796152667537,
  SearchFacetColumns1796153787338,
  SearchDocumentsNarrowRows1796158092958,
  RequestLifecycle1796166638665,
  FiringSciencePass1796167522134,
  FiringKindsAndHalfCones1796167600000,
  PieceSupport1796167700000,
  Hardening1796172202396,
  ReviewsAfterPickup1796174002687,
  StudioPayouts1796174302372,
  LoadPiecesAndPlans1796175115835,
  IncidentsAndClaims1796189313576,
  IncidentRemedies1796200407089,
  KeptCards1796200576439,
]
