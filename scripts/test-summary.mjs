// Totals over every runner of npm test; prints the one closing line "N passed, N failed".
// A runner whose report is missing counts as one failure, so a crash never reads as green.
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const dir = process.argv[2];
let passed = 0;
let failed = 0;

const vitestFile = join(dir, 'vitest.json');
if (existsSync(vitestFile)) {
	const report = JSON.parse(readFileSync(vitestFile, 'utf8'));
	passed += report.numPassedTests ?? 0;
	failed += (report.numFailedTests ?? 0) + (report.numFailedTestSuites ?? 0);
	if ((report.numTotalTests ?? 0) === 0) failed += 1;
} else {
	console.log('vitest: no report (counted as a failure)');
	failed += 1;
}

const buildFailed =
	existsSync(join(dir, 'extra-failed')) &&
	readFileSync(join(dir, 'extra-failed'), 'utf8').includes('build');
const playwrightFile = join(dir, 'playwright.json');
if (existsSync(playwrightFile)) {
	const stats = JSON.parse(readFileSync(playwrightFile, 'utf8')).stats ?? {};
	passed += (stats.expected ?? 0) + (stats.flaky ?? 0);
	failed += stats.unexpected ?? 0;
	if ((stats.expected ?? 0) + (stats.unexpected ?? 0) + (stats.flaky ?? 0) === 0) failed += 1;
} else if (!buildFailed) {
	console.log('playwright: no report (counted as a failure)');
	failed += 1;
}

for (const [file, isPass] of [
	['extra-passed', true],
	['extra-failed', false]
]) {
	const path = join(dir, file);
	if (!existsSync(path)) continue;
	const lines = readFileSync(path, 'utf8').split('\n').filter(Boolean);
	if (isPass) passed += lines.length;
	else failed += lines.length;
}

console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
