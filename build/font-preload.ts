import type { Plugin } from 'vite'

/**
 * Adds `<link rel="preload" as="font">` for the built font files whose names match, so the browser
 * fetches the fonts of the first screen with the stylesheet instead of after it has laid out the
 * page. The files are hashed by the build, so the links are written once the names are known.
 */
export function fontPreload(files: RegExp): Plugin {
  return {
    name: 'conewright:font-preload',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler(_html, ctx) {
        const fonts = Object.keys(ctx.bundle ?? {})
          .filter((name) => files.test(name))
          .sort()
        return fonts.map((name) => ({
          tag: 'link',
          attrs: { rel: 'preload', href: `/${name}`, as: 'font', type: 'font/woff2', crossorigin: '' },
          injectTo: 'head' as const,
        }))
      },
    },
  }
}
