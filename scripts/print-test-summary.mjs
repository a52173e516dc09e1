// Reads vitest's JSON report and prints the plain closing line "N passed, N failed".
// Failed quality gates (build, lint, typecheck) count as failures. Exits 1 when anything failed or no test ran.
import { existsSync, readFileSync } from 'node:fs'

const [file, gateFailuresArg = '0'] = process.argv.slice(2)
const gateFailures = Number(gateFailuresArg) || 0
let passed = 0
let failed = 0
let skipped = 0
if (file && existsSync(file)) {
  const report = JSON.parse(readFileSync(file, 'utf8'))
  passed = report.numPassedTests ?? 0
  failed = report.numFailedTests ?? 0
  skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0)
  // A file that failed before any test ran (import error, failed hook) counts as one failure.
  for (const fileResult of report.testResults ?? []) {
    const ran = (fileResult.assertionResults ?? []).some(a => a.status === 'failed')
    if (fileResult.status === 'failed' && !ran) failed += 1
  }
} else {
  console.error('No vitest report found: the test run did not complete.')
  failed += 1
}
failed += gateFailures
console.log(`\n${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`)
if (passed === 0) console.error('No test ran.')
process.exit(failed > 0 || passed === 0 ? 1 : 0)
