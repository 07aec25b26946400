import { describe, expect, it } from 'vitest';
import { withCappedBody } from '$lib/server/http/capped-body';

/** A request whose body arrives in `pieces` chunks of `size` bytes, with no Content-Length. */
function chunkedRequest(pieces: number, size: number): Request {
	let sent = 0;
	const body = new ReadableStream<Uint8Array>({
		pull(controller) {
			if (sent === pieces) return controller.close();
			sent += 1;
			controller.enqueue(new Uint8Array(size).fill(0x61));
		}
	});
	return new Request('http://app.test/signin?/password', {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded' },
		body,
		duplex: 'half'
	} as RequestInit);
}

describe('withCappedBody', () => {
	it('keeps a chunked body of exactly the limit, byte for byte', async () => {
		const capped = await withCappedBody(chunkedRequest(4, 256), 1024);
		expect(capped).not.toBeNull();
		expect(await capped!.text()).toBe('a'.repeat(1024));
		expect(capped!.headers.get('content-type')).toBe('application/x-www-form-urlencoded');
		expect(capped!.method).toBe('POST');
	});

	it('refuses a chunked body one chunk past the limit', async () => {
		expect(await withCappedBody(chunkedRequest(5, 256), 1024)).toBeNull();
	});

	it('leaves a request that states its length to the Content-Length check', async () => {
		const stated = new Request('http://app.test/x', {
			method: 'POST',
			headers: { 'content-length': '4' },
			body: 'abcd'
		});
		expect(await withCappedBody(stated, 1)).toBe(stated);
	});
});
