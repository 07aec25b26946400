// A tiny round-robin HTTP proxy in its own process, for machines without nginx:
// PORT=P BACKENDS=http://127.0.0.1:A,http://127.0.0.1:B node bench/lib/round-robin.mjs
// Prints "listening PORT". Each request goes to the next backend in turn over kept-alive
// connections; the client's address is passed on in X-Forwarded-For, as nginx does.
import { Agent, createServer, request } from 'node:http';

const backends = (process.env.BACKENDS ?? '')
	.split(',')
	.filter(Boolean)
	.map((b) => new URL(b));
const agent = new Agent({ keepAlive: true, maxSockets: 64 });
let next = 0;

const server = createServer((incoming, outgoing) => {
	const backend = backends[next++ % backends.length];
	const forwarded = [incoming.headers['x-forwarded-for'], incoming.socket.remoteAddress]
		.filter(Boolean)
		.join(', ');
	const upstream = request(
		{
			host: backend.hostname,
			port: backend.port,
			method: incoming.method,
			path: incoming.url,
			headers: { ...incoming.headers, 'x-forwarded-for': forwarded, connection: 'keep-alive' },
			agent
		},
		(answer) => {
			outgoing.writeHead(answer.statusCode ?? 502, answer.headers);
			answer.pipe(outgoing);
		}
	);
	upstream.on('error', () => {
		if (!outgoing.headersSent) outgoing.writeHead(502);
		outgoing.end();
	});
	incoming.pipe(upstream);
});
server.keepAliveTimeout = 5_000;
server.listen(Number(process.env.PORT ?? 0), '127.0.0.1', () =>
	console.log(`listening ${server.address().port}`)
);
process.on('SIGTERM', () => server.close(() => process.exit(0)));
