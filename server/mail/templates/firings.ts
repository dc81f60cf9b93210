import { formatDateTime } from '../../../shared/dates'
import { formatCone } from '../../../shared/firing/cones'
import type { MailContent } from '../render'

export interface FiringFacts {
  studioName: string
  kilnName: string
  cone: string
  atmosphere: string
  kind: string
  firingDate: Date
  timezone: string
}

export const firingTitle = (f: FiringFacts) => `${formatCone(f.cone)} ${f.atmosphere} ${f.kind} firing`

export function firingCancelledMail(name: string, firing: FiringFacts, reason: string, url: string): MailContent {
  return {
    subject: `Firing called off: ${firingTitle(firing)} at ${firing.studioName}`,
    greeting: `Hello ${name},`,
    paragraphs: [
      `${firing.studioName} has called off the ${firingTitle(firing)} you asked to join. Your place in it goes with it.`,
      `Their reason: “${reason}”`,
      'Any deposit you paid is refunded in full. You can look for another firing with space on Conewright.',
    ],
    details: [
      ['Kiln', firing.kilnName],
      ['Was to fire', formatDateTime(firing.firingDate, firing.timezone)],
    ],
    action: { label: 'See it on Conewright', url },
  }
}

export function crewInviteMail(studioName: string, inviterName: string, url: string): MailContent {
  return {
    subject: `${inviterName} invites you to the crew of ${studioName} on Conewright`,
    paragraphs: [
      `${inviterName} has invited you to help run ${studioName} on Conewright: checking ware in, loading, logging firings and posting results.`,
      'Open the link to join. If you have no Conewright account yet, you can make one there. The link works once and expires in 7 days.',
    ],
    action: { label: `Join ${studioName}`, url },
    footnote: 'If you were not expecting this, ignore this mail.',
  }
}
