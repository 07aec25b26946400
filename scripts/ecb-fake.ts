/*
 * Local stand-in for the European Central Bank's daily reference-rate file, for development
 * and tests: tsx scripts/ecb-fake.ts (normally started in the background by scripts/ecb-fake.sh).
 *
 * HTTP on 127.0.0.1:${ECB_FAKE_PORT:-2590}:
 *   GET /stats/eurofxref/eurofxref-daily.xml   the fixed file, same path as on the ECB's site
 *   GET /health                                { ok, asOf }
 *
 * The file is tests/fixtures/ecb/eurofxref-2024-01-02.xml: the real reference rates the ECB
 * published for 2 January 2024 (source: ECB, "Euro foreign exchange reference rates",
 * eurofxref-hist.csv, row 2024-01-02; docs/sources.md 10c), in the ECB's XML layout. A past
 * day on purpose: the app must show these rates as stale, which is the honest label.
 */
import { readFileSync } from 'node:fs';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const HOST = '127.0.0.1';
const PORT = Number(process.env.ECB_FAKE_PORT ?? 2590);
const FIXTURE = resolve(
	dirname(fileURLToPath(import.meta.url)),
	'../tests/fixtures/ecb/eurofxref-2024-01-02.xml'
);
const DAILY_PATH = '/stats/eurofxref/eurofxref-daily.xml';

const body = readFileSync(FIXTURE);
const asOf = /time=['"](\d{4}-\d{2}-\d{2})['"]/.exec(body.toString('utf8'))?.[1] ?? null;

function log(event: string, detail: Record<string, unknown> = {}) {
	console.log(JSON.stringify({ t: new Date().toISOString(), kind: 'ecb-fake', event, ...detail }));
}

function handle(req: IncomingMessage, res: ServerResponse) {
	const path = new URL(req.url ?? '/', `http://${HOST}`).pathname;
	if (req.method !== 'GET' && req.method !== 'HEAD') {
		res.writeHead(405, { allow: 'GET, HEAD', 'content-type': 'text/plain' }).end('Use GET\n');
		return;
	}
	if (path === DAILY_PATH) {
		res.writeHead(200, {
			'content-type': 'text/xml; charset=utf-8',
			'content-length': String(body.length),
			'cache-control': 'no-store'
		});
		res.end(req.method === 'HEAD' ? undefined : body);
		log('served', { path });
		return;
	}
	if (path === '/health') {
		res.writeHead(200, {
			'content-type': 'application/json; charset=utf-8',
			'cache-control': 'no-store'
		});
		res.end(JSON.stringify({ ok: true, asOf }));
		return;
	}
	res.writeHead(404, { 'content-type': 'text/plain' }).end('Not found\n');
}

const server = createServer((req, res) => {
	try {
		handle(req, res);
	} catch (e) {
		log('error', { error: String(e) });
		if (!res.headersSent) res.writeHead(500).end();
	}
});

server.once('error', (e) => {
	console.error(`ECB fake could not listen on ${HOST}:${PORT}: ${e.message}`);
	process.exit(1);
});
server.listen(PORT, HOST, () => log('ready', { url: `http://${HOST}:${PORT}${DAILY_PATH}`, asOf }));

function shutdown(signal: string) {
	log('stopping', { signal });
	setTimeout(() => process.exit(0), 2_000).unref();
	server.close(() => process.exit(0));
	server.closeAllConnections();
}
process.once('SIGTERM', () => shutdown('SIGTERM'));
process.once('SIGINT', () => shutdown('SIGINT'));
