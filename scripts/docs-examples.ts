// `npm run docs:examples`: recomputes the engine examples that docs/api.md shows, from the
// request files in docs/examples/, and rewrites the response files and the blocks in docs/api.md.
// Run it whenever the engine's figures change (and bump ENGINE_VERSION).
import { readFileSync, writeFileSync } from 'node:fs'
import { assess } from '../shared/engine/assess'
import { sensitivity } from '../shared/engine/sensitivity'
import { sweep } from '../shared/engine/sweep'
import { AssessInputSchema } from '../shared/schemas/assess'
import { SensitivityRequestSchema, SweepRequestSchema } from '../shared/schemas/engineRequests'

const read = (name: string): unknown => JSON.parse(readFileSync(`docs/examples/${name}.request.json`, 'utf8'))
const examples: Record<string, unknown> = {
  assess: assess(AssessInputSchema.parse(read('assess'))),
  sweep: (() => {
    const { input, grid } = SweepRequestSchema.parse(read('sweep'))
    return sweep(input, grid)
  })(),
  sensitivity: (() => {
    const { input, fraction } = SensitivityRequestSchema.parse(read('sensitivity'))
    return sensitivity(input, fraction)
  })(),
}

let doc = readFileSync('docs/api.md', 'utf8')
for (const [name, response] of Object.entries(examples)) {
  const json = JSON.stringify(response, null, 2)
  writeFileSync(`docs/examples/${name}.response.json`, `${json}\n`)
  for (const kind of ['request', 'response'] as const) {
    const body = kind === 'request' ? readFileSync(`docs/examples/${name}.request.json`, 'utf8').trim() : json
    const open = `<!-- example ${name} ${kind} -->`
    const close = `<!-- /example ${name} ${kind} -->`
    const start = doc.indexOf(open)
    const end = doc.indexOf(close)
    if (start < 0 || end < 0) throw new Error(`docs/api.md has no ${open} … ${close} block`)
    doc = `${doc.slice(0, start + open.length)}\n\`\`\`json\n${body}\n\`\`\`\n${doc.slice(end)}`
  }
}
writeFileSync('docs/api.md', doc)
console.log('Engine examples rewritten in docs/api.md and docs/examples/.')
