/**
 * The loop under each background worker of an app process (the mail queue, photo
 * processing, the scheduler): rounds until stop(), a pause after a round that found nothing
 * to do, and poke() to end a pause early when new work was just queued. A round that throws
 * is reported and the loop goes on; stop() lets the round in hand finish.
 */
export class BackgroundLoop {
	private stopping = false;
	private running: Promise<void> | null = null;
	private wake: (() => void) | null = null;

	/**
	 * @param round one round of work; true when it did something (go again at once)
	 * @param pauseMs the pause after a round that did nothing
	 * @param onError what to do with a round's error (log it)
	 */
	constructor(
		private readonly round: () => Promise<boolean>,
		private readonly pauseMs: number,
		private readonly onError: (error: unknown) => void
	) {}

	/** True once stop() was called, until the next start(): work in hand should wind down. */
	get stopped(): boolean {
		return this.stopping;
	}

	/** Starts the loop; false when it was already running. */
	start(): boolean {
		if (this.running) return false;
		this.stopping = false;
		this.running = (async () => {
			while (!this.stopping) {
				let busy = false;
				try {
					busy = await this.round();
				} catch (error) {
					this.onError(error);
				}
				if (!busy && !this.stopping) await this.pause();
			}
		})();
		return true;
	}

	/** Ends the loop after the round in hand. */
	async stop(): Promise<void> {
		this.stopping = true;
		this.wake?.();
		await this.running;
		this.running = null;
	}

	/** Ends a pause early. */
	poke(): void {
		this.wake?.();
	}

	private pause(): Promise<void> {
		return new Promise((resolve) => {
			const done = () => {
				clearTimeout(timer);
				this.wake = null;
				resolve();
			};
			const timer = setTimeout(done, this.pauseMs);
			this.wake = done;
		});
	}
}
