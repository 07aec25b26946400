/*
 * A reverse proxy in front of several app processes, for benchmarks: nginx from Debian's
 * packages when installed (`apt-get install nginx-light`), with the same settings as the
 * example in docs/deployment.md, else the tiny Node round-robin in bench/lib/round-robin.mjs.
 * Either runs in its own process on a free loopback port.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { ROOT, waitFor200 } from './harness';

export interface Proxy {
	origin: string;
	kind: 'nginx' | 'node round-robin';
	/** The proxy's main process (nginx: the master; its worker does the proxying). */
	pid?: number;
	stop: () => Promise<void>;
}

const NGINX = '/usr/sbin/nginx';

/** The upstream and location of docs/deployment.md, on loopback, in a throwaway prefix. */
export function nginxConfig(prefix: string, port: number, backends: string[]): string {
	return `worker_processes 1;
daemon off;
pid ${prefix}/nginx.pid;
error_log ${prefix}/error.log warn;
events { worker_connections 1024; }
http {
	access_log off;
	client_body_temp_path ${prefix}/body;
	proxy_temp_path ${prefix}/proxy;
	fastcgi_temp_path ${prefix}/fastcgi;
	uwsgi_temp_path ${prefix}/uwsgi;
	scgi_temp_path ${prefix}/scgi;
	upstream slotwise_app {
${backends.map((b) => `\t\tserver ${new URL(b).host} max_fails=1 fail_timeout=5s;`).join('\n')}
		keepalive 32;
	}
	server {
		listen 127.0.0.1:${port};
		client_max_body_size 2m;
		location / {
			proxy_pass http://slotwise_app;
			proxy_http_version 1.1;
			proxy_set_header Connection "";
			proxy_set_header Host $host;
			proxy_set_header X-Forwarded-For $proxy_add_x_forwarded_for;
			proxy_set_header X-Forwarded-Proto $scheme;
			proxy_next_upstream error timeout http_502;
			proxy_read_timeout 60s;
		}
	}
}
`;
}

function waitForListening(child: ReturnType<typeof spawn>): Promise<number> {
	return new Promise((done, fail) => {
		let out = '';
		child.stdout?.on('data', (chunk: Buffer) => {
			out += chunk.toString();
			const match = /listening (\d+)/.exec(out);
			if (match) done(Number(match[1]));
		});
		child.once('exit', (code) => fail(new Error(`proxy exited with ${code}`)));
	});
}

/** Listens on `port` (chosen beforehand, so the apps behind it can be told their ORIGIN). */
export async function startProxy(backends: string[], port: number): Promise<Proxy> {
	if (existsSync(NGINX) && process.env.BENCH_PROXY !== 'node') {
		const prefix = mkdtempSync(join(tmpdir(), 'slotwise-nginx-'));
		for (const dir of ['body', 'proxy', 'fastcgi', 'uwsgi', 'scgi']) mkdirSync(join(prefix, dir));
		writeFileSync(join(prefix, 'nginx.conf'), nginxConfig(prefix, port, backends));
		const child = spawn(NGINX, ['-p', prefix, '-c', join(prefix, 'nginx.conf')], {
			stdio: ['ignore', 'ignore', 'inherit']
		});
		const origin = `http://127.0.0.1:${port}`;
		await waitFor200(`${origin}/api/health`, 15_000);
		return {
			origin,
			kind: 'nginx',
			pid: child.pid,
			stop: () =>
				new Promise((done) => {
					child.once('exit', () => {
						rmSync(prefix, { recursive: true, force: true });
						done();
					});
					child.kill('SIGQUIT');
				})
		};
	}
	const child = spawn(process.execPath, [resolve(ROOT, 'bench/lib/round-robin.mjs')], {
		env: { ...process.env, BACKENDS: backends.join(','), PORT: String(port) },
		stdio: ['ignore', 'pipe', 'inherit']
	});
	const origin = `http://127.0.0.1:${await waitForListening(child)}`;
	return {
		origin,
		kind: 'node round-robin',
		pid: child.pid,
		stop: () =>
			new Promise((done) => {
				child.once('exit', () => done());
				child.kill('SIGTERM');
			})
	};
}
