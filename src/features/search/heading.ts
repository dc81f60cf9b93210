/** The search page's heading, also drawn in the page's place while its code arrives (src/app/router.tsx). */
export const FIND_HEADING = {
  title: 'Find a firing',
  lead: 'Open firings that can take your ware: the right cone and atmosphere, a drop-off date that suits, room for your piece.',
}
