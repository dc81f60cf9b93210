import type { QueryClient } from '@tanstack/react-query'
import { matchRoutes, type createBrowserRouter } from 'react-router-dom'
import { nextLikely, pages, type PageName } from './pages'
import type { PageHandle } from './router'

type Router = ReturnType<typeof createBrowserRouter>
type LoadablePage = keyof typeof pages

const started = new Set<LoadablePage>()
/** How long a page's queries must have been quiet before the next pages are fetched. */
const SETTLE_MS = 2000

function isLoadable(name: PageName | undefined): name is LoadablePage {
  return name !== undefined && name in pages
}

/** Loads a page's chunk into the module cache once; a failure is left for the real navigation to report. */
function prefetchPage(name: LoadablePage) {
  if (started.has(name)) return
  started.add(name)
  pages[name]().catch(() => started.delete(name))
}

function pageAt(router: Router, pathname: string): PageName | undefined {
  const matches = matchRoutes(router.routes, pathname) ?? []
  return (matches.at(-1)?.route.handle as PageHandle | undefined)?.page
}

/** People on a metered or very slow line asked for less traffic: only prefetch what they point at. */
function saveData(): boolean {
  const connection = (navigator as Navigator & { connection?: { saveData?: boolean; effectiveType?: string } }).connection
  return Boolean(connection?.saveData) || /(^|-)2g$/.test(connection?.effectiveType ?? '')
}

function whenIdle(run: () => void) {
  if (typeof window.requestIdleCallback === 'function') window.requestIdleCallback(run, { timeout: 4000 })
  else setTimeout(run, 1500)
}

/**
 * Prefetches page chunks: the page behind a link as soon as someone points at it, touches it or tabs
 * to it, and the next likely pages once the current one has finished its own loading (its
 * queries are in and the browser is idle), so prefetching never competes with the page being read.
 */
export function startPrefetching(router: Router, queryClient: QueryClient) {
  const onIntent = (event: Event) => {
    const link = (event.target as Element | null)?.closest?.('a[href]')
    if (!(link instanceof HTMLAnchorElement) || link.origin !== window.location.origin) return
    const name = pageAt(router, link.pathname)
    if (isLoadable(name)) prefetchPage(name)
  }
  for (const type of ['pointerover', 'focusin', 'touchstart']) document.addEventListener(type, onIntent, { passive: true, capture: true })

  let scheduledFor: string | null = null
  const prefetchNext = () => {
    const { navigation, location, matches } = router.state
    if (navigation.state !== 'idle' || scheduledFor === location.key || saveData()) return
    scheduledFor = location.key
    const page = (matches.at(-1)?.route.handle as PageHandle | undefined)?.page
    const next = page ? (nextLikely[page] ?? []) : []
    if (next.length === 0) return
    // The page's own work is done when its queries have been quiet for a while (its lazy parts,
    // like the map, come in that while) and the browser has loaded everything it was given.
    let quietSince = Date.now()
    const settle = () => {
      if (scheduledFor !== location.key) return
      if (queryClient.isFetching() > 0 || document.readyState !== 'complete') quietSince = Date.now()
      if (Date.now() - quietSince < SETTLE_MS) {
        window.setTimeout(settle, 250)
        return
      }
      whenIdle(() => {
        if (scheduledFor !== location.key) return
        // Marked for the web bench, which counts what comes after as prefetched, not as the page's.
        performance.mark('conewright:prefetch')
        next.forEach(prefetchPage)
      })
    }
    settle()
  }
  router.subscribe(prefetchNext)
  prefetchNext()
}
