import type { MailContent } from '../render'

export function verifyEmailMail(name: string, url: string): MailContent {
  return {
    subject: 'Confirm your e-mail address for Conewright',
    greeting: `Hello ${name},`,
    paragraphs: [
      'Thanks for joining Conewright. Confirm this address so studios and potters can reach you about firings.',
      'The link works once and expires in 48 hours.',
    ],
    action: { label: 'Confirm my address', url },
    footnote: 'If you did not sign up, ignore this mail; no account will be confirmed.',
  }
}

export function signInLinkMail(name: string, url: string): MailContent {
  return {
    subject: 'Your one-time Conewright sign-in link',
    greeting: `Hello ${name},`,
    paragraphs: [
      'Someone has been trying many passwords on this Conewright account, so signing in with a password is paused for a while. This link signs you in without one.',
      'The link works once and expires in 15 minutes. If the guessing goes on, set a new, longer password once you are in.',
    ],
    action: { label: 'Sign me in', url },
    footnote: 'If you did not ask for this link, ignore this mail; the pause protects your account either way.',
  }
}

export function passwordResetMail(name: string, url: string): MailContent {
  return {
    subject: 'Set a new Conewright password',
    greeting: `Hello ${name},`,
    paragraphs: [
      'Someone asked to set a new password for this Conewright account. If it was you, use the link below.',
      'The link works once and expires in one hour. Your current password keeps working until then.',
    ],
    action: { label: 'Set a new password', url },
    footnote: 'If you did not ask for this, ignore this mail; your password stays as it is.',
  }
}
