/**
 * Whether this page's first screen came drawn in its HTML (the build prerenders a few pages for
 * visitors, build/prerender.ts), or is being drawn for that HTML right now on the server side of the
 * build. A page that would otherwise show a spinner while it asks who is signed in can then keep
 * showing what is already there.
 */
export function drawnAhead(): boolean {
  return typeof document === 'undefined' || document.getElementById('root')?.dataset.prerendered !== undefined
}
