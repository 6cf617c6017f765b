// nuxt-security puts `'nonce-{{nonce}}'` in a page's content security policy and fills in the
// request's nonce when it renders the HTML. A page that answers with a redirect instead (a
// signed-in visitor opening /signup is sent to /) never renders, so the placeholder went out as
// written. Just before the head of any answer is sent, an unfilled placeholder is taken out: a
// redirect runs no script, and a policy naming a literal "{{nonce}}" is never right.
const PLACEHOLDER = /\s*'nonce-\{\{nonce\}\}'/g

function fill(value: unknown): unknown {
  if (typeof value === 'string') return value.includes('{{nonce}}') ? value.replace(PLACEHOLDER, '') : value
  if (Array.isArray(value)) return value.map(fill)
  return value
}

export default defineEventHandler((event) => {
  if (event.path.startsWith('/api/') || event.path.startsWith('/_nuxt/')) return
  const res = event.node.res
  const writeHead = res.writeHead
  res.writeHead = function (this: typeof res, ...args: Parameters<typeof writeHead>) {
    for (const name of ['content-security-policy', 'content-security-policy-report-only']) {
      const value = res.getHeader(name)
      if (value !== undefined) res.setHeader(name, fill(value) as string | string[])
    }
    return writeHead.apply(this, args)
  } as typeof writeHead
})
