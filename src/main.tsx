import { StrictMode } from 'react'
import { createRoot, hydrateRoot } from 'react-dom/client'
import { createBrowserRouter, RouterProvider } from 'react-router-dom'
import { startPrefetching } from './app/prefetch'
import { createQueryClient, Providers } from './app/providers'
import { routes } from './app/router'
import './styles.css'

const router = createBrowserRouter(routes)
const queryClient = createQueryClient()
startPrefetching(router, queryClient)

const app = (
  <StrictMode>
    <Providers client={queryClient}>
      <RouterProvider router={router} />
    </Providers>
  </StrictMode>
)
const root = document.getElementById('root')!
// A page the build drew ahead (build/prerender.ts) is taken over as it stands rather than drawn
// again, so what the reader already sees stays put.
if (root.dataset.prerendered !== undefined) hydrateRoot(root, app)
else createRoot(root).render(app)
