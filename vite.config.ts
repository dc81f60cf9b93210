import tailwindcss from '@tailwindcss/vite'
import react from '@vitejs/plugin-react'
import path from 'node:path'
import { defineConfig } from 'vite'
import { offlineBasemap } from './build/basemap/plugin.ts'
import { fontPreload } from './build/font-preload.ts'
import { precompress } from './build/precompress.ts'
import { prerenderPages } from './build/prerender.ts'
import { sourcemapsOutOfPublic } from './build/sourcemaps.ts'

// The client. In development the API runs on API_PORT and Vite proxies /api to it.
// The build splits the client by route (src/app/router.tsx), writes brotli and gzip copies of every
// text file for the server to send as they are (server/http/client-files.ts), and keeps the source
// maps out of the public folder.
export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // The weights on the first screen of most pages: body text, buttons and headings, the big title.
    fontPreload(/dm-sans-latin-(400|600|700)-normal-[\w-]+\.woff2$/),
    sourcemapsOutOfPublic(path.resolve(import.meta.dirname, 'dist/sourcemaps')),
    offlineBasemap(),
    // The pages phones open first, drawn into their HTML: the landing page (for visitors; a
    // signed-in person is sent on to their own page) and the search page's heading.
    prerenderPages([
      { path: '/', file: 'index.landing.html', visitorsOnly: true },
      { path: '/find', file: 'index.find.html' },
    ]),
    precompress(path.resolve(import.meta.dirname, 'node_modules/.cache/conewright-precompress')),
  ],
  build: {
    outDir: 'dist/client',
    emptyOutDir: true,
    rolldownOptions: {
      output: {
        // Everything the first screen needs in one file: over HTTP/1.1 on a phone, each further
        // file of the first load waits its turn for one of six connections.
        codeSplitting: { groups: [{ name: 'index', tags: ['$initial'] }] },
      },
    },
  },
  server: {
    host: '127.0.0.1',
    proxy: {
      '/api': `http://127.0.0.1:${process.env.API_PORT ?? 4611}`,
    },
  },
})
