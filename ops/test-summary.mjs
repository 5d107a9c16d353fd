#!/usr/bin/env node
// Prints one table of passed / failed / skipped tests per suite from the suites' JSON result files
// (jest --json, vitest's json reporter, Playwright's json reporter) and exits non-zero when any suite
// failed, exited non-zero, or left no result file.
//
//   node ops/test-summary.mjs --dir .data/test-results --suite "name=file.json=exitCode" ... [--build 0] [--seconds 93]
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const args = process.argv.slice(2);
const opt = (name) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : undefined;
};
const dir = opt('dir') ?? '.data/test-results';
const suites = args
  .flatMap((a, i) => (a === '--suite' ? [args[i + 1]] : []))
  .map((spec) => {
    const [name, file, rc] = spec.split('=');
    return { name, file, exitCode: rc === undefined || rc === '' ? null : Number(rc) };
  });

/** Counts from one result file, whatever produced it. */
function counts(report) {
  if (report && report.stats && typeof report.stats.expected === 'number') {
    // Playwright: expected = passed, unexpected = failed, flaky = passed on a retry.
    const s = report.stats;
    return {
      passed: s.expected + (s.flaky ?? 0),
      failed: s.unexpected,
      skipped: s.skipped ?? 0,
      flaky: s.flaky ?? 0,
      errors: report.errors?.length ?? 0,
    };
  }
  if (report && typeof report.numTotalTests === 'number') {
    // jest --json and vitest's json reporter share this shape.
    const brokenFiles = (report.testResults ?? []).filter(
      (r) => r.status === 'failed' && (r.assertionResults ?? []).every((a) => a.status !== 'failed'),
    ).length;
    const suiteErrors = Math.max(report.numRuntimeErrorTestSuites ?? 0, brokenFiles);
    return {
      passed: report.numPassedTests ?? 0,
      failed: report.numFailedTests ?? 0,
      skipped: (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0),
      flaky: 0,
      errors: suiteErrors,
      success: report.success,
    };
  }
  return null;
}

const rows = suites.map((s) => {
  const path = join(dir, s.file);
  if (!existsSync(path))
    return { ...s, status: 'NO RESULTS', passed: '-', failed: '-', skipped: '-', bad: true, note: `${s.file} missing` };
  let c;
  try {
    c = counts(JSON.parse(readFileSync(path, 'utf8')));
  } catch (e) {
    return { ...s, status: 'BAD RESULTS', passed: '-', failed: '-', skipped: '-', bad: true, note: `${s.file}: ${e.message}` };
  }
  if (!c) return { ...s, status: 'BAD RESULTS', passed: '-', failed: '-', skipped: '-', bad: true, note: `${s.file}: unknown format` };
  const notes = [];
  if (c.errors) notes.push(`${c.errors} file(s) failed to load or run`);
  if (c.flaky) notes.push(`${c.flaky} flaky`);
  if (s.exitCode) notes.push(`runner exit ${s.exitCode}`);
  if (c.passed + c.failed + c.skipped === 0) notes.push('no tests found');
  const bad = c.failed > 0 || c.errors > 0 || c.success === false || !!s.exitCode || c.passed + c.failed === 0;
  return { ...s, status: bad ? 'FAILED' : 'passed', passed: c.passed, failed: c.failed, skipped: c.skipped, bad, note: notes.join(', ') };
});

const num = (v) => (typeof v === 'number' ? v : 0);
const total = {
  name: 'total',
  status: rows.some((r) => r.bad) ? 'FAILED' : 'passed',
  passed: rows.reduce((a, r) => a + num(r.passed), 0),
  failed: rows.reduce((a, r) => a + num(r.failed), 0),
  skipped: rows.reduce((a, r) => a + num(r.skipped), 0),
  note: '',
};
const build = opt('build');
if (build !== undefined && build !== '0') total.note = `the build failed (exit ${build})`;
const buildBad = build !== undefined && build !== '0';
if (buildBad) total.status = 'FAILED';

const cols = [
  ['suite', (r) => r.name],
  ['result', (r) => r.status],
  ['passed', (r) => String(r.passed)],
  ['failed', (r) => String(r.failed)],
  ['skipped', (r) => String(r.skipped)],
  ['notes', (r) => r.note ?? ''],
];
const table = [...rows, total];
const width = cols.map(([h, f]) => Math.max(h.length, ...table.map((r) => f(r).length)));
const line = (cells) =>
  cells
    .map((c, i) => (i >= 2 && i <= 4 ? c.padStart(width[i]) : c.padEnd(width[i])))
    .join('  ')
    .trimEnd();
const rule = width.map((w) => '-'.repeat(w)).join('  ');
console.log('');
console.log(line(cols.map(([h]) => h)));
console.log(rule);
for (const r of rows) console.log(line(cols.map(([, f]) => f(r))));
console.log(rule);
console.log(line(cols.map(([, f]) => f(total))));
const seconds = opt('seconds');
if (seconds)
  console.log(`\n${total.status === 'passed' ? 'all suites passed' : 'some suites FAILED'} in ${seconds} s; result files in ${dir}`);
process.exit(total.status === 'passed' ? 0 : 1);
