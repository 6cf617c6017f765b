// The frame every Gillwatt e-mail shares: a plain-text body and a simple HTML body built from the
// same paragraphs, so both say the same thing. Everything interpolated into HTML is escaped.

/** A rendered e-mail, before it is addressed. */
export interface RenderedMail {
  subject: string
  text: string
  html: string
}

/** One block of an e-mail: a paragraph, a quoted block of someone's words, or a button-like link. */
export type MailBlock = { p: string } | { quote: string; label?: string } | { link: string; label: string }

/** Escapes text for HTML. */
export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!)
}

const FOOTER = 'Gillwatt screens river weirs for throat-suction venturi schemes. Its figures are screening estimates, not a design.'

/** Builds the text and HTML bodies from the same blocks. */
export function renderMail(subject: string, greeting: string, blocks: readonly MailBlock[]): RenderedMail {
  const text: string[] = [greeting, '']
  const html: string[] = [`<p>${escapeHtml(greeting)}</p>`]
  for (const b of blocks) {
    if ('p' in b) {
      text.push(b.p, '')
      html.push(`<p>${escapeHtml(b.p)}</p>`)
    } else if ('quote' in b) {
      if (b.label) text.push(`${b.label}:`)
      text.push(...b.quote.split('\n').map((l) => `> ${l}`), '')
      html.push(
        `${b.label ? `<p><strong>${escapeHtml(b.label)}</strong></p>` : ''}<blockquote style="margin:0 0 1em;padding:0.5em 1em;border-left:3px solid #2f7d6d;white-space:pre-wrap">${escapeHtml(b.quote)}</blockquote>`,
      )
    } else {
      text.push(`${b.label}: ${b.link}`, '')
      html.push(`<p><a href="${escapeHtml(b.link)}" style="color:#1f5f8b">${escapeHtml(b.label)}</a></p>`)
    }
  }
  text.push('—', FOOTER)
  html.push(`<hr style="border:none;border-top:1px solid #ccd"><p style="color:#556;font-size:0.85em">${escapeHtml(FOOTER)}</p>`)
  return {
    subject,
    text: text.join('\n'),
    html: `<!doctype html><html lang="en"><body style="font-family:Nunito,Arial,sans-serif;line-height:1.5;color:#1d2b36;max-width:40em">${html.join('\n')}</body></html>`,
  }
}

/** A date as people read it in an e-mail: 12 March 2026, 14:05 UTC. */
export function mailDate(iso: string): string {
  const d = new Date(iso)
  const day = d.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })
  const time = d.toLocaleTimeString('en-GB', { hour: '2-digit', minute: '2-digit', timeZone: 'UTC' })
  return `${day}, ${time} UTC`
}
