import path from 'node:path'
import { pathToFileURL } from 'node:url'
import { tsImport } from 'tsx/esm/api'
import type { Plugin } from 'vite'

/** A page whose first screen is written into its own copy of index.html. */
export interface PrerenderedPage {
  path: string
  file: string
  /** Only for people without a session: a signed-in person is sent on from this page. */
  visitorsOnly?: boolean
}

/** What the server reads to pick a page's HTML: `prerendered.json` in the built client. */
export type PrerenderManifest = Record<string, { file: string; visitorsOnly: boolean }>

export const PRERENDER_MANIFEST = 'prerendered.json'
const EMPTY_ROOT = '<div id="root"></div>'

/**
 * Writes, for each page named, a copy of index.html whose root already holds the page's first
 * screen as a visitor sees it (src/app/prerender.tsx, run here under tsx), with the stylesheet
 * inlined, so the browser paints it as soon as the HTML is in, long before the scripts have
 * arrived and run. The scripts then draw the same screen over it and carry on.
 */
export function prerenderPages(pages: PrerenderedPage[]): Plugin {
  let root = process.cwd()
  return {
    name: 'conewright:prerender',
    apply: 'build',
    enforce: 'post',
    configResolved(config) {
      root = config.root
    },
    async generateBundle(_options, bundle) {
      const index = bundle['index.html']
      if (!index || index.type !== 'asset' || typeof index.source !== 'string' || !index.source.includes(EMPTY_ROOT))
        this.error('prerender: index.html with an empty #root was not found in the bundle')
      const { prerender } = (await tsImport(pathToFileURL(path.join(root, 'src/app/prerender.tsx')).href, import.meta.url)) as {
        prerender: (path: string) => string
      }
      // The stylesheet goes into these pages too, so the first paint waits for nothing but the
      // HTML (not for the stylesheet, which would share the line with the scripts). The link stays
      // for print only, which blocks nothing: the lazy pages' loader finds the stylesheet there and
      // does not ask for it again, and the cached copy serves the next pages.
      let shell = index.source as string
      const link = /<link rel="stylesheet"[^>]*href="\/(assets\/[^"]+\.css)"[^>]*>/.exec(shell)
      const css = link ? bundle[link[1]] : undefined
      if (link && css?.type === 'asset')
        shell = shell.replace(link[0], () => `<style>${String(css.source)}</style>${link[0].replace('<link ', '<link media="print" ')}`)
      const manifest: PrerenderManifest = {}
      for (const page of pages) {
        const html = shell.replace(EMPTY_ROOT, () => `<div id="root" data-prerendered="${page.path}">${prerender(page.path)}</div>`)
        this.emitFile({ type: 'asset', fileName: page.file, source: html })
        manifest[page.path] = { file: page.file, visitorsOnly: page.visitorsOnly ?? false }
      }
      this.emitFile({ type: 'asset', fileName: PRERENDER_MANIFEST, source: JSON.stringify(manifest, null, 2) })
    },
  }
}
