// Every migration in the order it runs. `npm run migration:generate -- Name` writes a new file into
// ./migrations; add its class to the end of this list.
import { Foundation1796149373286 } from './migrations/1796149373286-Foundation'

export const migrations: Function[] = [Foundation1796149373286]
