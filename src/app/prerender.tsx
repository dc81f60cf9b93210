import { renderToString } from 'react-dom/server'
import { createMemoryRouter, RouterProvider } from 'react-router-dom'
import { createQueryClient, Providers } from './providers'
import { routes } from './router'

/**
 * The first screen of a page as a visitor sees it before any answer has arrived (nobody signed in
 * yet, no data): the layout and what the route draws at once. The build writes it into that page's
 * HTML (build/prerender.ts), so a phone paints it before the scripts have even arrived.
 */
export function prerender(path: string): string {
  const router = createMemoryRouter(routes, { initialEntries: [path] })
  try {
    return renderToString(
      <Providers client={createQueryClient()}>
        <RouterProvider router={router} />
      </Providers>,
    )
  } finally {
    router.dispose()
  }
}
