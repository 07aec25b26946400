/** CPU time of processes from /proc, for each one's share of the machine in bench/load.ts. */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { ROOT } from './harness';

/** CPU seconds (user + system) a process and its children have used so far, from /proc; 0 when gone. */
const TICKS_PER_SECOND =
	Number(execFileSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).trim()) || 100;
export function cpuSeconds(pid: number): number {
	return ownCpuSeconds(pid) + childrenOf(pid).reduce((sum, child) => sum + cpuSeconds(child), 0);
}
/** Child processes (nginx's workers do the proxying, not its master). */
function childrenOf(pid: number): number[] {
	try {
		return readFileSync(`/proc/${pid}/task/${pid}/children`, 'utf8')
			.split(' ')
			.filter(Boolean)
			.map(Number);
	} catch {
		return [];
	}
}
function ownCpuSeconds(pid: number): number {
	try {
		// The fields after the command name (which may hold spaces): utime and stime are 14 and 15.
		const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
		const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
		return (Number(fields[11]) + Number(fields[12])) / TICKS_PER_SECOND;
	} catch {
		return 0;
	}
}

/** mariadbd of this checkout (scripts/db.sh writes its pid), for its share of the CPU. */
export function mariadbPid(): number {
	try {
		return Number(readFileSync(resolve(ROOT, '.data/mariadb.pid'), 'utf8').trim());
	} catch {
		return 0;
	}
}
