// Totals over every runner of npm test; prints the one closing line "N passed, N failed".
// A runner whose report is missing counts as one failure, so a crash never reads as green.
import { existsSync, readFileSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';

const dir = process.argv[2];
let passed = 0;
let failed = 0;
// Every failure by name, printed just above the closing line: a CI log's tail says what failed.
const names = [];
const firstLine = (text) =>
	String(text ?? '')
		.split('\n')[0]
		.slice(0, 160);

const vitestFile = join(dir, 'vitest.json');
if (existsSync(vitestFile)) {
	const report = JSON.parse(readFileSync(vitestFile, 'utf8'));
	passed += report.numPassedTests ?? 0;
	failed += report.numFailedTests ?? 0;
	for (const file of report.testResults ?? []) {
		const where = relative(resolve(dir, '..'), file.name ?? '');
		const failing = (file.assertionResults ?? []).filter((a) => a.status === 'failed');
		for (const a of failing) names.push(`vitest ${where} › ${a.fullName ?? a.title}`);
		// A file that failed without a failing test did not load or crashed in a hook.
		if (file.status === 'failed' && failing.length === 0) {
			failed += 1;
			names.push(`vitest ${where} (the file failed: ${firstLine(file.message)})`);
		}
	}
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
	const report = JSON.parse(readFileSync(playwrightFile, 'utf8'));
	const stats = report.stats ?? {};
	const walk = (suite, titles) => {
		for (const spec of suite.specs ?? [])
			for (const test of spec.tests ?? [])
				if (test.status === 'unexpected')
					names.push(
						`playwright ${spec.file}:${spec.line} › ${[...titles, spec.title].join(' › ')}`
					);
		for (const child of suite.suites ?? []) walk(child, [...titles, child.title].filter(Boolean));
	};
	for (const suite of report.suites ?? []) walk(suite, []);
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
	else {
		failed += lines.length;
		for (const line of lines) names.push(`check ${line.split(' ')[0]}`);
	}
}

if (names.length > 0) console.log(`Failed:\n${names.map((n) => `  ✗ ${n}`).join('\n')}`);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
