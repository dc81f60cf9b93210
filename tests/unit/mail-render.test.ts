import { describe, expect, it } from 'vitest'
import { renderMail } from '../../server/mail/render'
import { passwordResetMail, verifyEmailMail } from '../../server/mail/templates/account'

describe('renderMail', () => {
  it('gives the text and HTML parts the same words from one template', () => {
    const mail = renderMail(verifyEmailMail('Ana', 'http://127.0.0.1:4610/verify-email?token=abc'))
    expect(mail.subject).toMatch(/Confirm/)
    for (const part of [mail.text, mail.html]) {
      expect(part).toContain('Hello Ana,')
      expect(part).toContain('http://127.0.0.1:4610/verify-email?token=abc')
      expect(part).toContain('expires in 48 hours')
    }
  })

  it('escapes what people type before it goes into HTML', () => {
    const mail = renderMail(passwordResetMail('<script>alert(1)</script>', 'http://x.test/?a=1&b=2'))
    expect(mail.html).not.toContain('<script>')
    expect(mail.html).toContain('&lt;script&gt;')
    expect(mail.html).toContain('a=1&amp;b=2')
    expect(mail.text).toContain('<script>alert(1)</script>')
  })

  it('lines up detail rows in the text part', () => {
    const mail = renderMail({
      subject: 's',
      paragraphs: [],
      details: [
        ['Pieces', '4'],
        ['Balance due', '$18.00'],
      ],
    })
    expect(mail.text).toContain('Pieces       4')
    expect(mail.text).toContain('Balance due  $18.00')
  })
})
