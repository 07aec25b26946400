/*
 * Uploads in the browser: one XMLHttpRequest per file, because only XHR reports upload
 * progress (fetch does not). Each upload goes through: uploading (bytes sent / total) →
 * processing (all bytes sent, the server is decoding and encoding) → done, or failed with
 * the server's message, or cancelled. Failed and cancelled uploads can be retried.
 */
export type UploadPhase = 'waiting' | 'uploading' | 'processing' | 'done' | 'failed' | 'cancelled';

export interface UploadEntry {
	id: number;
	file: File;
	phase: UploadPhase;
	/** 0–1 of the bytes sent. */
	sent: number;
	message: string | null;
}

export interface UploadedPhoto {
	id: number;
	[key: string]: unknown;
}

let nextId = 1;

export class PhotoUploads {
	entries = $state<UploadEntry[]>([]);
	#requests = new Map<number, XMLHttpRequest>();
	#url: string;
	#fields: () => Record<string, string>;
	#onDone: (photo: UploadedPhoto) => void;
	/** At most this many uploads at once; the rest wait their turn. */
	#parallel = 2;

	constructor(
		url: string,
		onDone: (photo: UploadedPhoto) => void,
		fields: () => Record<string, string> = () => ({})
	) {
		this.#url = url;
		this.#onDone = onDone;
		this.#fields = fields;
	}

	add(files: FileList | File[]) {
		for (const file of Array.from(files)) {
			this.entries.push({ id: nextId++, file, phase: 'waiting', sent: 0, message: null });
		}
		this.#pump();
	}

	cancel(id: number) {
		this.#requests.get(id)?.abort();
		this.#set(id, { phase: 'cancelled', message: 'Cancelled.' });
		this.#pump();
	}

	retry(id: number) {
		this.#set(id, { phase: 'waiting', sent: 0, message: null });
		this.#pump();
	}

	dismiss(id: number) {
		this.entries = this.entries.filter((e) => e.id !== id);
	}

	get busy(): boolean {
		return this.entries.some((e) => ['waiting', 'uploading', 'processing'].includes(e.phase));
	}

	#set(id: number, patch: Partial<UploadEntry>) {
		const entry = this.entries.find((e) => e.id === id);
		if (entry) Object.assign(entry, patch);
	}

	#pump() {
		const active = this.entries.filter((e) => e.phase === 'uploading' || e.phase === 'processing');
		const next = this.entries.filter((e) => e.phase === 'waiting');
		for (const entry of next.slice(0, Math.max(0, this.#parallel - active.length)))
			this.#send(entry);
	}

	#send(entry: UploadEntry) {
		const id = entry.id;
		const request = new XMLHttpRequest();
		this.#requests.set(id, request);
		const body = new FormData();
		body.append('file', entry.file);
		for (const [name, value] of Object.entries(this.#fields())) body.append(name, value);
		request.open('POST', this.#url);
		request.responseType = 'json';
		request.setRequestHeader('accept', 'application/json');
		request.upload.onprogress = (e) => {
			if (e.lengthComputable) this.#set(id, { sent: e.loaded / e.total });
		};
		request.upload.onload = () => this.#set(id, { sent: 1, phase: 'processing' });
		request.onload = () => {
			this.#requests.delete(id);
			const answer = request.response as { message?: string; id?: number } | null;
			if (request.status === 201 && answer?.id) {
				this.#set(id, { phase: 'done', sent: 1, message: null });
				this.#onDone(answer as UploadedPhoto);
			} else {
				const retry = request.getResponseHeader('retry-after');
				this.#set(id, {
					phase: 'failed',
					message:
						(answer?.message ?? `The upload failed (${request.status}).`) +
						(retry ? ` Try again in ${retry} s.` : '')
				});
			}
			this.#pump();
		};
		request.onerror = () => {
			this.#requests.delete(id);
			this.#set(id, {
				phase: 'failed',
				message: 'The connection broke off; retry when you are online.'
			});
			this.#pump();
		};
		this.#set(id, { phase: 'uploading', sent: 0, message: null });
		request.send(body);
	}
}
