// Prints the one closing line CI counts: "N passed, N failed" over every jest project.
const fs = require('node:fs');

const file = process.argv[2];
if (!fs.existsSync(file)) {
  console.log('0 passed, 1 failed');
  console.error('jest wrote no results: it failed before running any test');
  process.exit(1);
}
const results = JSON.parse(fs.readFileSync(file, 'utf8'));
// A suite that fails to load has no test results of its own: count it as a failure.
const brokenSuites = results.testResults.filter((s) => s.status === 'failed' && s.assertionResults.length === 0).length;
const failed = results.numFailedTests + brokenSuites;
console.log(`${results.numPassedTests} passed, ${failed} failed` + (results.numPendingTests ? `, ${results.numPendingTests} skipped` : ''));
process.exit(failed > 0 || results.numTotalTests === 0 ? 1 : 0);
