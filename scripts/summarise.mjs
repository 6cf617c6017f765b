// Prints the one closing line CI reads, "N passed, N failed[, N skipped]", counted from the
// JSON reports the test runners wrote into .reports/. Exits 1 when a report is missing or any
// test failed.
import { existsSync, readFileSync, readdirSync } from 'node:fs'

const dir = '.reports'
const files = existsSync(dir) ? readdirSync(dir).filter((f) => f.endsWith('.json')) : []
let passed = 0
let failed = 0
let skipped = 0
let broken = files.length === 0
for (const file of files) {
  const report = JSON.parse(readFileSync(`${dir}/${file}`, 'utf8'))
  passed += report.numPassedTests ?? 0
  failed += report.numFailedTests ?? 0
  skipped += (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0)
  // A suite that failed to load counts as a failure even when no test inside it ran.
  if (report.numFailedTestSuites > 0 && !report.numFailedTests) failed += report.numFailedTestSuites
  if (report.success === false) broken = true
}
if (broken && failed === 0) failed = 1
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`)
process.exit(failed > 0 ? 1 : 0)
