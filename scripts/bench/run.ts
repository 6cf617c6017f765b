// `npm run bench`: runs every benchmark and appends a dated section to docs/benchmarks.md.
// The HTTP suites start the built server (.output, never built here: run `npm run build` first).
//   npm run bench                        every suite, appended to docs/benchmarks.md
//   npm run bench -- upload "http load"  only suites whose title contains one of the words
//   npm run bench -- --no-write …        print the figures, append nothing
import { appendFileSync, existsSync, writeFileSync } from 'node:fs'
import { bundleBench } from './bundle'
import { engineBench } from './engine'
import { type BenchFigure, machine } from './harness'
import { httpBench } from './http'
import { portfolioBench } from './portfolio'
import { poolLoadBench } from './poolLoad'
import { portfolioPageBench } from './portfolioPage'
import { assertBuilt } from './server'
import { uploadBench } from './upload'

const FILE = 'docs/benchmarks.md'

interface Suite {
  title: string
  run: () => BenchFigure[] | Promise<BenchFigure[]>
  /** Starts the built server. */
  needsBuild: boolean
}
const suites: Suite[] = [
  { title: 'Engine', run: engineBench, needsBuild: false },
  { title: 'Portfolio', run: portfolioBench, needsBuild: false },
  { title: 'HTTP load', run: httpBench, needsBuild: true },
  { title: 'Engine pool under load', run: poolLoadBench, needsBuild: true },
  { title: 'Upload', run: uploadBench, needsBuild: true },
  { title: 'Portfolio page', run: portfolioPageBench, needsBuild: true },
  { title: 'Client JavaScript', run: bundleBench, needsBuild: true },
]

const args = process.argv.slice(2)
const write = !args.includes('--no-write')
const words = args.filter((a) => !a.startsWith('--')).map((a) => a.toLowerCase())
const chosen = words.length ? suites.filter((s) => words.some((w) => s.title.toLowerCase().includes(w))) : suites
if (chosen.length === 0) {
  console.error(`No suite matches ${words.join(', ')}; suites: ${suites.map((s) => s.title).join(', ')}.`)
  process.exit(2)
}
if (chosen.some((s) => s.needsBuild)) {
  try {
    assertBuilt()
  } catch (error) {
    console.error(error instanceof Error ? error.message : error)
    process.exit(1)
  }
}

const lines = [`\n## ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC`, '', `Machine: ${machine()}`, '']
let failed = 0
let broken = 0
for (const { title, run } of chosen) {
  console.log(`— ${title}`)
  lines.push(`### ${title}`, '', '| measure | figure | target | met |', '|---|---|---|---|')
  let figures: BenchFigure[]
  try {
    figures = await run()
  } catch (error) {
    // A suite that cannot run is a failure in the record, and the run exits non-zero.
    const message = (error instanceof Error ? error.message : String(error)).split('\n')[0]!.replace(/\|/g, '\\|')
    console.error(`FAIL ${title} did not run:`, error)
    lines.push(`| the suite did not run: ${message} | — | — | **no** |`, '')
    broken++
    continue
  }
  for (const f of figures) {
    const shown = f.display ?? `${f.value.toFixed(2)}${f.unit ? ` ${f.unit}` : ''}`
    lines.push(`| ${f.name} | ${shown} | ${f.target} | ${f.pass ? 'yes' : '**no**'} |`)
    if (!f.pass) failed++
    console.log(`${f.pass ? 'ok ' : 'MISS'} ${f.name}: ${shown} (target ${f.target})`)
  }
  lines.push('')
}
if (write) {
  if (!existsSync(FILE)) {
    writeFileSync(FILE, '# Benchmarks\n\nWritten by `npm run bench`; each run appends a section. Targets stand beside each figure.\n')
  }
  appendFileSync(FILE, lines.join('\n'))
}
const missed = failed ? `; ${failed} target(s) missed` : ''
const notRun = broken ? `; ${broken} suite(s) did not run` : ''
console.log(write ? `Figures appended to ${FILE}${missed}${notRun}.` : `Nothing appended (--no-write)${missed}${notRun}.`)
if (broken) process.exitCode = 1
