/** The search page's heading, drawn above the page by its route (src/app/router.tsx, RouteHeading). */
export const FIND_HEADING = {
  title: 'Find a firing',
  lead: 'Open firings that can take your ware: the right cone and atmosphere, a drop-off date that suits, room for your piece.',
}
