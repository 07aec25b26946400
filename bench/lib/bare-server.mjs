// A bare node:http server in its own process: the ceiling the app is compared with. It
// answers every request with the bytes of BARE_FILE (and BARE_TYPE as content type) and
// prints "listening <port>" once it accepts connections. Plain Node, no tsx: nothing of
// the harness runs inside it.
import { readFileSync } from 'node:fs';
import { createServer } from 'node:http';

const body = readFileSync(process.env.BARE_FILE ?? '');
const type = process.env.BARE_TYPE ?? 'text/html';
const server = createServer((_req, res) => {
	res.writeHead(200, { 'content-type': type, 'content-length': body.length });
	res.end(body);
});
server.listen(0, '127.0.0.1', () => {
	const address = server.address();
	process.stdout.write(`listening ${typeof address === 'object' && address ? address.port : 0}\n`);
});
process.on('SIGTERM', () => server.close(() => process.exit(0)));
