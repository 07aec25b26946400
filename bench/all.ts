/*
 * Every `bench:*` script in package.json, one after another (found there, so a benchmark
 * added later is picked up without touching this file). Each writes its own section of
 * docs/benchmarks.md; this adds a summary of the run at the top. Run through `npm run bench`,
 * which prepares the database and the build first.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { ROOT, machineNotes, writeBenchSection } from './lib/harness';

const scripts = (
	JSON.parse(readFileSync(resolve(ROOT, 'package.json'), 'utf8')) as {
		scripts: Record<string, string>;
	}
).scripts;
const names = Object.keys(scripts)
	.filter((name) => name.startsWith('bench:'))
	.sort();
const started = new Date();
const rows: string[] = [];
let failed = 0;
for (const name of names) {
	console.log(`\n==> npm run ${name}`);
	const t0 = performance.now();
	const run = spawnSync('npm', ['run', '--silent', name], { cwd: ROOT, stdio: 'inherit' });
	const minutes = (performance.now() - t0) / 60_000;
	const ok = run.status === 0;
	if (!ok) failed++;
	rows.push(
		`| \`npm run ${name}\` | ${ok ? 'done' : `**failed (exit ${run.status})**`} | ${minutes.toFixed(1)} |`
	);
}
writeBenchSection('all', [
	'## Last full run (`npm run bench`)',
	'',
	`Started ${started.toISOString().slice(0, 16).replace('T', ' ')} UTC on ${machineNotes()}. Every \`bench:*\``,
	'script of package.json in turn; each section below is from that run unless its own date says otherwise.',
	'',
	'| script | outcome | minutes |',
	'| --- | --- | ---: |',
	...rows
]);
console.log(
	`\n${names.length - failed} of ${names.length} benchmarks ran; docs/benchmarks.md rewritten.`
);
process.exit(failed > 0 ? 1 : 0);
