// `npm run bench`: runs every benchmark and appends a dated section to docs/benchmarks.md.
import { appendFileSync, existsSync, writeFileSync } from 'node:fs'
import { engineBench } from './engine'
import { type BenchFigure, machine } from './harness'
import { portfolioBench } from './portfolio'

const FILE = 'docs/benchmarks.md'
const suites: [string, () => BenchFigure[] | Promise<BenchFigure[]>][] = [['Engine', engineBench], ['Portfolio', portfolioBench]]

if (!existsSync(FILE)) {
  writeFileSync(FILE, '# Benchmarks\n\nWritten by `npm run bench`; each run appends a section. Targets stand beside each figure.\n')
}
const lines = [`\n## ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC`, '', `Machine: ${machine()}`, '']
let failed = 0
for (const [title, run] of suites) {
  const figures = await run()
  lines.push(`### ${title}`, '', '| measure | figure | target | met |', '|---|---|---|---|')
  for (const f of figures) {
    lines.push(`| ${f.name} | ${f.value.toFixed(2)} ${f.unit} | ${f.target} | ${f.pass ? 'yes' : '**no**'} |`)
    if (!f.pass) failed++
    console.log(`${f.pass ? 'ok ' : 'MISS'} ${f.name}: ${f.value.toFixed(2)} ${f.unit} (target ${f.target})`)
  }
  lines.push('')
}
appendFileSync(FILE, lines.join('\n'))
console.log(`Figures appended to ${FILE}${failed ? `; ${failed} target(s) missed` : ''}.`)
