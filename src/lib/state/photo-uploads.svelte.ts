/*
 * Uploads in the browser: one XMLHttpRequest per file, because only XHR reports upload
 * progress (fetch does not). Each upload goes through: uploading (bytes sent / total) →
 * processing (all bytes sent; the server checks the file, then, for a guide photo, answers
 * at once and makes the sizes in the background: its status URL is polled for the files
 * made so far) → done, or failed with the server's message, or cancelled. Cancel during
 * processing deletes the photo on the server. Failed and cancelled uploads can be retried.
 * The form fields sent with a file (alt text, caption) are taken when it is added, so a
 * file waiting its turn, or retried, keeps its own even after the form has moved on.
 */
export type UploadPhase = 'waiting' | 'uploading' | 'processing' | 'done' | 'failed' | 'cancelled';

/** A phase in words, as the upload row shows it. */
export const PHASE_WORDS: Record<UploadPhase, string> = {
	waiting: 'Waiting',
	uploading: 'Uploading',
	processing: 'Processing',
	done: 'Done',
	failed: 'Failed',
	cancelled: 'Cancelled'
};

export interface UploadEntry {
	id: number;
	file: File;
	phase: UploadPhase;
	/** 0–1 of the bytes sent. */
	sent: number;
	message: string | null;
	/** 0–1 of the files the server has made (null until it reports any). */
	processed: number | null;
	/** The same as counts, for the words beside the bar. */
	sizes: { done: number; total: number } | null;
	/** The photo's status URL while the server holds a row for this upload. */
	statusUrl: string | null;
	/** Sent with the file: the form's fields when it was added. */
	fields: Record<string, string>;
}

interface UploadStatus {
	id: number;
	state: 'processing' | 'ready' | 'failed';
	progress: { done: number; total: number };
	message: string | null;
	statusUrl: string;
	photo: UploadedPhoto | null;
}

/** Time between two status polls while the server processes a photo. */
const POLL_MS = 700;

export interface UploadedPhoto {
	id: number;
	[key: string]: unknown;
}

let nextId = 1;

export class PhotoUploads {
	entries = $state<UploadEntry[]>([]);
	#requests = new Map<number, XMLHttpRequest>();
	#polls = new Map<number, ReturnType<typeof setTimeout>>();
	#url: string;
	#fields: () => Record<string, string>;
	#onDone: (photo: UploadedPhoto, entry: UploadEntry) => void;
	/** At most this many uploads at once; the rest wait their turn. */
	#parallel = 2;

	constructor(
		url: string,
		/** Told of each photo once it is ready, with its entry (ids grow in the order files were picked). */
		onDone: (photo: UploadedPhoto, entry: UploadEntry) => void,
		fields: () => Record<string, string> = () => ({})
	) {
		this.#url = url;
		this.#onDone = onDone;
		this.#fields = fields;
	}

	add(files: FileList | File[]) {
		for (const file of Array.from(files)) {
			this.entries.push({
				id: nextId++,
				file,
				phase: 'waiting',
				sent: 0,
				message: null,
				processed: null,
				sizes: null,
				statusUrl: null,
				fields: this.#fields()
			});
		}
		this.#pump();
	}

	cancel(id: number) {
		this.#requests.get(id)?.abort();
		this.#stopPolling(id);
		this.#set(id, { phase: 'cancelled', message: 'Cancelled.' });
		void this.#forget(id);
		this.#pump();
	}

	async retry(id: number) {
		await this.#forget(id);
		this.#set(id, { phase: 'waiting', sent: 0, message: null, processed: null });
		this.#pump();
	}

	dismiss(id: number) {
		void this.#forget(id);
		this.entries = this.entries.filter((e) => e.id !== id);
	}

	/** Deletes the server's row of a cancelled or failed upload (its files go with it). */
	async #forget(id: number) {
		const entry = this.entries.find((e) => e.id === id);
		const url = entry?.statusUrl;
		if (!entry || !url || entry.phase === 'done') return;
		entry.statusUrl = null;
		// The API takes JSON bodies only, DELETE included.
		await fetch(url, {
			method: 'DELETE',
			headers: { 'content-type': 'application/json', accept: 'application/json' },
			body: '{}'
		}).catch(() => undefined);
	}

	#stopPolling(id: number) {
		clearTimeout(this.#polls.get(id));
		this.#polls.delete(id);
	}

	/** Follows a photo the server is processing until it is ready or failed. */
	#follow(id: number, status: UploadStatus) {
		const entry = this.entries.find((e) => e.id === id);
		if (!entry || entry.phase !== 'processing') return;
		const { done, total } = status.progress;
		if (status.state === 'ready' && status.photo) {
			this.#set(id, { phase: 'done', processed: 1, statusUrl: null, message: null });
			this.#onDone(status.photo, entry);
			this.#pump();
			return;
		}
		if (status.state === 'failed') {
			this.#set(id, {
				phase: 'failed',
				message: status.message ?? 'The photo could not be processed.'
			});
			this.#pump();
			return;
		}
		this.#set(id, {
			processed: total > 0 ? done / total : 0,
			sizes: { done, total },
			statusUrl: status.statusUrl
		});
		this.#polls.set(
			id,
			setTimeout(async () => {
				this.#polls.delete(id);
				try {
					const answer = await fetch(status.statusUrl, { headers: { accept: 'application/json' } });
					if (answer.status === 404) {
						this.#set(id, { phase: 'failed', statusUrl: null, message: 'The photo was removed.' });
						return;
					}
					if (answer.ok) return this.#follow(id, (await answer.json()) as UploadStatus);
				} catch {
					// A dropped poll is tried again below.
				}
				this.#follow(id, status);
			}, POLL_MS)
		);
	}

	get busy(): boolean {
		return this.entries.some((e) => ['waiting', 'uploading', 'processing'].includes(e.phase));
	}

	#set(id: number, patch: Partial<UploadEntry>) {
		const entry = this.entries.find((e) => e.id === id);
		if (entry) Object.assign(entry, patch);
	}

	#pump() {
		// Only bytes on the wire count: photos the server is processing in the background
		// wait in its queue, not here.
		const active = this.entries.filter(
			(e) => e.phase === 'uploading' || (e.phase === 'processing' && e.statusUrl === null)
		);
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
		for (const [name, value] of Object.entries(entry.fields)) body.append(name, value);
		request.open('POST', this.#url);
		request.responseType = 'json';
		request.setRequestHeader('accept', 'application/json');
		request.upload.onprogress = (e) => {
			if (e.lengthComputable) this.#set(id, { sent: e.loaded / e.total });
		};
		request.upload.onload = () => this.#set(id, { sent: 1, phase: 'processing' });
		request.onload = () => {
			this.#requests.delete(id);
			const answer = request.response as
				({ message?: string; id?: number } & Partial<UploadStatus>) | null;
			if (request.status === 201 && answer?.id && answer.state && answer.statusUrl) {
				// A guide photo: accepted, its sizes are made in the background.
				this.#set(id, {
					phase: 'processing',
					sent: 1,
					processed: 0,
					statusUrl: answer.statusUrl
				});
				this.#follow(id, answer as UploadStatus);
			} else if (request.status === 201 && answer?.id) {
				this.#set(id, { phase: 'done', sent: 1, message: null });
				this.#onDone(answer as UploadedPhoto, entry);
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
		this.#set(id, { phase: 'uploading', sent: 0, message: null, processed: null, statusUrl: null });
		request.send(body);
	}
}
