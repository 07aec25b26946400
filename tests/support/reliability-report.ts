/*
 * The fault and restore tests write what they measured into docs/reliability.md, each into
 * its own section between `<!-- reliability:NAME:start -->` and its end marker, so the
 * document always shows the figures of the last run. RELIABILITY_WRITE=0 leaves it alone
 * (for a run on a branch that should not touch the docs).
 */
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { resolve } from 'node:path';

const FILE = resolve(import.meta.dirname, '../../docs/reliability.md');

/** When and where: the figures depend on the machine and what else it was doing. */
export function runNote(): string {
	return `Run ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${cpus().length} × ${
		cpus()[0]?.model ?? 'unknown CPU'
	}, Node ${process.version}, load average ${loadavg()
		.map((n) => n.toFixed(1))
		.join(' / ')} (1/5/15 min).`;
}

export function writeReliabilitySection(name: string, lines: string[]): void {
	if (process.env.RELIABILITY_WRITE === '0') return;
	const start = `<!-- reliability:${name}:start -->`;
	const end = `<!-- reliability:${name}:end -->`;
	const section = [start, ...lines, end].join('\n');
	const current = existsSync(FILE) ? readFileSync(FILE, 'utf8') : '# Reliability\n';
	const from = current.indexOf(start);
	const to = current.indexOf(end);
	writeFileSync(
		FILE,
		from >= 0 && to > from
			? current.slice(0, from) + section + current.slice(to + end.length)
			: `${current.trimEnd()}\n\n${section}\n`
	);
}
