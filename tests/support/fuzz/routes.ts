// Every route of the running app, found by walking Express's router: method, path pattern and the
// validations its middleware declares (validateBody, validateQuery and the photo upload attach theirs).
// A route someone adds tomorrow is found the same way, with nothing to list by hand.
import type { Express } from 'express'
import { validationOf, type Validation } from '../../../server/http/validate'

export interface AppRoute {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE'
  /** Express pattern, e.g. /api/requests/:id/photos */
  path: string
  params: string[]
  body: Validation | null
  query: Validation | null
  multipart: Validation | null
}

interface Layer {
  rawPath?: string | RegExp | (string | RegExp)[]
  handle: { stack?: Layer[] } & ((...args: never[]) => unknown)
  route?: { path: string | string[]; methods: Record<string, boolean>; stack: Layer[] }
}

const METHODS = new Set(['get', 'post', 'put', 'patch', 'delete'])

export function appRoutes(app: Express): AppRoute[] {
  const routes: AppRoute[] = []
  const walk = (stack: Layer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const validations = layer.route.stack.map((l) => validationOf(l.handle)).filter((v): v is Validation => v !== null)
        for (const path of [layer.route.path].flat()) {
          for (const method of Object.keys(layer.route.methods).filter((m) => METHODS.has(m))) {
            const full = prefix + path
            routes.push({
              method: method.toUpperCase() as AppRoute['method'],
              path: full,
              params: [...full.matchAll(/:(\w+)/g)].map((m) => m[1]),
              body: validations.find((v) => v.where === 'body') ?? null,
              query: validations.find((v) => v.where === 'query') ?? null,
              multipart: validations.find((v) => v.where === 'multipart') ?? null,
            })
          }
        }
      } else if (layer.handle?.stack) {
        const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : ''
        walk(layer.handle.stack, prefix + mount)
      }
    }
  }
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '')
  return routes
}
