// Prints the plain closing line "N passed, N failed" from vitest's JSON report, and fails
// when no test ran, so an empty run cannot look green.
import { readFileSync } from 'node:fs';

const report = JSON.parse(readFileSync(process.argv[2], 'utf8'));
const passed = report.numPassedTests ?? 0;
const failed = report.numFailedTests ?? 0;
const skipped = report.numPendingTests ?? 0;
console.log(`${passed} passed, ${failed} failed, ${skipped} skipped`);
if (passed + failed === 0) {
  console.error('No test ran.');
  process.exit(1);
}
