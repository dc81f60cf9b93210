import { StrictMode } from 'react'
import { createRoot } from 'react-dom/client'
import { RouterProvider } from 'react-router-dom'
import { startPrefetching } from './app/prefetch'
import { createQueryClient, Providers } from './app/providers'
import { router } from './app/router'
import './styles.css'

const queryClient = createQueryClient()
startPrefetching(router, queryClient)

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <Providers client={queryClient}>
      <RouterProvider router={router} />
    </Providers>
  </StrictMode>,
)
