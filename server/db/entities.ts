// Every entity, listed once for the data source (esbuild-based runners cannot glob decorated classes).
import { AuthToken } from '../entities/AuthToken'
import { Firing } from '../entities/Firing'
import { FiringRequest } from '../entities/FiringRequest'
import { Kiln } from '../entities/Kiln'
import { KilnPriceList } from '../entities/KilnPriceList'
import { OutboundMail } from '../entities/OutboundMail'
import { Rating } from '../entities/Rating'
import { RequestEvent } from '../entities/RequestEvent'
import { SearchDocument } from '../entities/SearchDocument'
import { Studio } from '../entities/Studio'
import { StudioMember } from '../entities/StudioMember'
import { User } from '../entities/User'

export const entities = [User, Studio, StudioMember, AuthToken, OutboundMail, Kiln, KilnPriceList, Firing, FiringRequest, RequestEvent, Rating, SearchDocument]
