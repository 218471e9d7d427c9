// Prints the closing line of `npm test` from vitest's JSON report, per layer and in total.
import { readFileSync } from 'node:fs';

const report = JSON.parse(readFileSync(process.argv[2], 'utf8'));
const layers = {};
for (const file of report.testResults) {
  const layer = /tests\/(unit|component|integration|e2e)\//.exec(file.name)?.[1] ?? 'other';
  layers[layer] ??= { passed: 0, failed: 0, skipped: 0 };
  for (const t of file.assertionResults) {
    if (t.status === 'passed') layers[layer].passed++;
    else if (t.status === 'failed') layers[layer].failed++;
    else layers[layer].skipped++;
  }
  if (file.status === 'failed' && file.assertionResults.length === 0) layers[layer].failed++;
}
const ORDER = ['unit', 'component', 'integration', 'e2e', 'other'];
const sorted = Object.entries(layers).sort(([a], [b]) => ORDER.indexOf(a) - ORDER.indexOf(b));
for (const [layer, c] of sorted) {
  console.log(`  ${layer.padEnd(12)} ${c.passed} passed, ${c.failed} failed, ${c.skipped} skipped`);
}
const total = Object.values(layers).reduce(
  (a, c) => ({ passed: a.passed + c.passed, failed: a.failed + c.failed, skipped: a.skipped + c.skipped }),
  { passed: 0, failed: 0, skipped: 0 },
);
console.log(`Tests: ${total.passed} passed, ${total.failed} failed, ${total.skipped} skipped`);
process.exit(total.failed > 0 || total.passed === 0 ? 1 : 0);
