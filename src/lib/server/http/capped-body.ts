/**
 * Bodies sent without a Content-Length (chunked) cannot be refused from a header, and
 * adapter-node bounds them only by BODY_SIZE_LIMIT, which is raised for photo uploads. Such a
 * body is read here up to the route's own limit; past it, the rest is read and dropped, so the
 * client still receives the 413 (closing the socket under a client that is still sending
 * resets the connection, and the client loses the answer with it).
 */

/** The body's bytes, or null as soon as more than `limit` bytes have arrived. */
export async function readCappedBody(
	body: ReadableStream<Uint8Array>,
	limit: number
): Promise<Uint8Array<ArrayBuffer> | null> {
	const reader = body.getReader();
	const chunks: Uint8Array[] = [];
	let total = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		total += value.byteLength;
		if (total > limit) {
			void discardRest(reader);
			return null;
		}
		chunks.push(value);
	}
	const bytes = new Uint8Array(total);
	let at = 0;
	for (const chunk of chunks) {
		bytes.set(chunk, at);
		at += chunk.byteLength;
	}
	return bytes;
}

/** Reads to the end and keeps nothing; adapter-node stops at BODY_SIZE_LIMIT. */
async function discardRest(reader: ReadableStreamDefaultReader<Uint8Array>): Promise<void> {
	try {
		while (!(await reader.read()).done);
	} catch {
		// The client went away or passed BODY_SIZE_LIMIT: either way there is nothing to read.
	}
}

/**
 * The same request with a body read up to `limit` bytes, or null once it passes the limit.
 * A request that states its length, or has no body, comes back as it was.
 */
export async function withCappedBody(request: Request, limit: number): Promise<Request | null> {
	if (!request.body || request.headers.has('content-length')) return request;
	const bytes = await readCappedBody(request.body, limit);
	if (!bytes) return null;
	const headers = new Headers(request.headers);
	headers.delete('transfer-encoding');
	return new Request(request.url, {
		method: request.method,
		headers,
		body: bytes,
		signal: request.signal
	});
}
