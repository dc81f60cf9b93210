// Every entity, listed once for the data source (esbuild-based runners cannot glob decorated classes).
import { AuthToken } from '../entities/AuthToken'
import { OutboundMail } from '../entities/OutboundMail'
import { Studio } from '../entities/Studio'
import { StudioMember } from '../entities/StudioMember'
import { User } from '../entities/User'

export const entities = [User, Studio, StudioMember, AuthToken, OutboundMail]
