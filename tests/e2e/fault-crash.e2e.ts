import { expect, test } from '@playwright/test';
import { runNote, writeReliabilitySection } from '../support/reliability-report';
import {
	type AppProcess,
	type ScratchDb,
	api,
	cleanUp,
	postForm,
	scratchDb,
	signIn,
	startApp
} from './processes';

/*
 * kill -9 of MariaDB during a stream of committed writes (docs/security.md §9, test 2).
 *
 * A scratch MariaDB started by scripts/db.sh (its durability settings are asserted too),
 * seeded, and `node build` in front of it. Five clients write through the app's HTTP API,
 * each recording a write only once the app has answered 2xx (the app answers after COMMIT):
 * forks, build title edits, syncs of earlier forks to a newer revision, draft saves, and
 * editors' verifications of price sightings (each one a quote, the sighting's decision and
 * an audit event in one transaction). mariadbd gets SIGKILL in the middle; the same script
 * starts it again while the clients keep going. Afterwards every acknowledged write must be
 * there, and every build, sync and decision must be whole: a write the crash interrupted is
 * either all there or not at all.
 */
test.describe.configure({ mode: 'serial', timeout: 240_000 });

const DB = 'slotwise_crash';
const FORKED = 'steady-1080p-starter';
const SYNCED = 'balanced-1440p-am5';
const SYNC_FORKS = 40;
const EDITED_BUILDS = 4;
const SIGHTINGS = 400;

const sleep = (ms: number) => new Promise((done) => setTimeout(done, ms));

let db: ScratchDb;
let app: AppProcess;
const sql = (query: string) => db.sql(query, DB);
const one = (query: string) => sql(query)[0]?.[0] ?? '';

test.beforeAll(async () => {
	// Set-up starts real processes: minutes on a loaded machine, not the 30 s default.
	test.setTimeout(180_000);
	db = await scratchDb('crash', [DB]);
	db.migrateAndSeed(DB);
	// Pending price sightings for the editor to decide, copied from the seeded quotes.
	sql(`INSERT INTO price_sightings
		(part_id, store_id, region_id, amount_minor, currency, observed_on, url, state, seen_count, created_at, updated_at)
		SELECT q.part_id, q.store_id, q.region_id, q.amount_minor + s.seq, q.currency, CURRENT_DATE,
			'https://shop.example.test/shelf', 'pending', 1, NOW(), NOW()
		FROM quotes q JOIN seq_1_to_5 s LIMIT ${SIGHTINGS}`);
	app = await startApp({ DB_PORT: String(db.port), DB_NAME: DB });
});

test.afterAll(cleanUp);

interface Ack {
	kind: string;
	at: number;
}

test('every write acknowledged before or after a SIGKILL of MariaDB is there, and none is half-written', async () => {
	// The durability settings scripts/db.sh starts MariaDB with (docs/security.md §9): flush the
	// redo log and sync the binary log at every commit. A SIGKILL alone could not tell 1 from 2.
	const variables = Object.fromEntries(
		db.sql(
			"SHOW GLOBAL VARIABLES WHERE Variable_name IN ('innodb_flush_log_at_trx_commit','sync_binlog','log_bin','innodb_doublewrite')"
		) as [string, string][]
	);
	expect(variables).toEqual({
		innodb_doublewrite: 'ON',
		innodb_flush_log_at_trx_commit: '1',
		log_bin: 'ON',
		sync_binlog: '1'
	});

	const origin = app.origin;
	const reader = await signIn(origin, 'reader@slotwise.test');
	const author = await signIn(origin, 'author@slotwise.test');
	const mira = await signIn(origin, 'mira.falkenberg@slotwise.test');
	const editor = await signIn(origin, 'editor@slotwise.test');
	const buildsBefore = Number(one('SELECT COALESCE(MAX(id), 0) FROM builds'));

	// Set-up through the API: forks of one guide to sync later, a few builds to edit, and a
	// newer revision of the synced guide (the author moves the graphics card pick to its first
	// alternate and submits; an editor approves).
	/*
	 * One reader makes far more forks here than the 20 an hour the app allows one account
	 * (src/lib/server/rate-limit.ts, forkByUser). This test is about durability, not limits: on
	 * a 429 the reader's count is forgotten in this scratch database and the fork sent again.
	 */
	const postFork = async (slug: string) => {
		const send = () => api(origin, 'POST', `/api/v1/guides/${slug}/fork`, reader, {});
		const response = await send();
		if (response.status !== 429) return response;
		sql("DELETE FROM rate_limits WHERE `key` LIKE 'fork\\_user:%'");
		return send();
	};
	const fork = async (slug: string) => {
		const response = await postFork(slug);
		expect(response.status).toBe(201);
		return ((await response.json()) as { id: number }).id;
	};
	const syncForks: number[] = [];
	for (let i = 0; i < SYNC_FORKS; i++) syncForks.push(await fork(SYNCED));
	const edited: { id: number; version: number }[] = [];
	for (let i = 0; i < EDITED_BUILDS; i++) edited.push({ id: await fork(FORKED), version: 1 });
	const oldRevision = one(`SELECT published_revision_id FROM guides WHERE slug = '${SYNCED}'`);
	await publishNewRevision(origin, mira, editor);
	const newRevision = one(`SELECT published_revision_id FROM guides WHERE slug = '${SYNCED}'`);
	expect(newRevision).not.toBe(oldRevision);
	const draft = (await (
		await api(origin, 'GET', `/api/v1/guides/${FORKED}/draft`, author)
	).json()) as DraftView;
	const sightingIds = sql("SELECT id FROM price_sightings WHERE state = 'pending' ORDER BY id").map(
		([id]) => Number(id)
	);
	const sightingQuotesBefore = Number(one("SELECT COUNT(*) FROM quotes WHERE source = 'sighting'"));

	// The stream.
	const acks: Ack[] = [];
	const failures: Record<string, number> = {};
	const ackedForks: number[] = [];
	const ackedEdits = new Map<number, { version: number; title: string }>();
	const ackedSyncs: number[] = [];
	const ackedDrafts: { version: number; summary: string }[] = [];
	const ackedDecisions: number[] = [];
	let stop = false;
	const ack = (kind: string) => acks.push({ kind, at: Date.now() });
	const failed = (kind: string) => (failures[kind] = (failures[kind] ?? 0) + 1);
	// A request that fails (the database is down) is retried after a pause, as a person would.
	const attempt = async (kind: string, work: () => Promise<boolean>) => {
		try {
			if (await work()) return;
		} catch {
			// connection refused, reset or timed out
		}
		failed(kind);
		await sleep(100);
	};

	const forker = async () => {
		while (!stop)
			await attempt('fork', async () => {
				const response = await postFork(FORKED);
				if (response.status !== 201) return false;
				ackedForks.push(((await response.json()) as { id: number }).id);
				ack('fork');
				return true;
			});
	};
	const editorOfBuilds = async () => {
		for (let n = 0; !stop; n++) {
			const build = edited[n % edited.length]!;
			const title = `Edit ${n} of build ${build.id}`;
			await attempt('build edit', async () => {
				const response = await api(origin, 'PATCH', `/api/v1/builds/${build.id}`, reader, {
					version: build.version,
					title
				});
				const body = (await response.json().catch(() => ({}))) as {
					version?: number;
					current?: { version: number };
				};
				if (response.status === 409 && body.current) {
					// An edit whose answer was lost in the crash may have committed: carry on from there.
					build.version = body.current.version;
					return true;
				}
				if (response.status !== 200 || body.version === undefined) return false;
				build.version = body.version;
				ackedEdits.set(build.id, { version: body.version, title });
				ack('build edit');
				return true;
			});
		}
	};
	const syncer = async () => {
		for (let i = 0; !stop && i < syncForks.length;) {
			const id = syncForks[i]!;
			let done = false;
			await attempt('sync', async () => {
				const response = await api(origin, 'POST', `/api/v1/builds/${id}/sync`, reader, {
					version: 1,
					takeAllNonConflicting: true
				});
				// 409: an earlier attempt committed and lost its answer. Not acknowledged; checked whole below.
				if (response.status === 409) return (done = true);
				if (response.status !== 200) return false;
				ackedSyncs.push(id);
				ack('sync');
				return (done = true);
			});
			if (done) i++;
		}
	};
	const drafter = async () => {
		let version = draft.version;
		for (let n = 0; !stop; n++) {
			const summary = `Draft save ${n}: ${draft.summary}`.slice(0, 2000);
			await attempt('draft save', async () => {
				const response = await api(origin, 'PUT', `/api/v1/guides/${FORKED}/draft`, author, {
					...draftBody(draft),
					version,
					summary
				});
				const body = (await response.json().catch(() => ({}))) as {
					version?: number;
					current?: { version: number };
				};
				if (response.status === 409 && body.current) {
					version = body.current.version;
					return true;
				}
				if (response.status !== 200 || body.version === undefined) return false;
				version = body.version;
				ackedDrafts.push({ version, summary });
				ack('draft save');
				return true;
			});
		}
	};
	const decider = async () => {
		for (let i = 0; !stop && i < sightingIds.length;) {
			const id = sightingIds[i]!;
			let done = false;
			await attempt('quote decision', async () => {
				const response = await postForm(
					origin,
					'/editor/sightings?/verify',
					{ sightingId: String(id) },
					editor
				);
				await response.arrayBuffer();
				if (response.status === 409) return (done = true);
				if (response.status !== 200) return false;
				ackedDecisions.push(id);
				ack('quote decision');
				return (done = true);
			});
			if (done) i++;
		}
	};

	const started = Date.now();
	// Three forking clients, so several multi-row transactions are in flight at the kill.
	const clients = Promise.all([
		forker(),
		forker(),
		forker(),
		editorOfBuilds(),
		syncer(),
		drafter(),
		decider()
	]);
	// Let every kind of write get going, then pull the plug.
	const kinds = ['fork', 'build edit', 'sync', 'draft save', 'quote decision'];
	while (Date.now() - started < 20_000 && !kinds.every((k) => acks.some((a) => a.kind === k)))
		await sleep(100);
	await sleep(1_500);
	const killedAt = Date.now();
	const acksBeforeKill = acks.length;
	db.kill9();
	await sleep(500);
	await db.startInBackground();
	const restartedAt = Date.now();
	// Keep writing until every kind has been acknowledged again after the restart, and a while longer.
	while (
		Date.now() - restartedAt < 30_000 &&
		!kinds.every((k) => acks.some((a) => a.kind === k && a.at > restartedAt))
	)
		await sleep(100);
	await sleep(2_000);
	stop = true;
	await clients;
	// The outage as the clients saw it: the longest stretch with no write acknowledged.
	const times = acks.map((a) => a.at).sort((a, b) => a - b);
	const longestGapMs = Math.max(...times.slice(1).map((t, i) => t - times[i]!));

	// Every kind of write went through both before the kill and after the restart.
	for (const kind of kinds) {
		expect(acks.filter((a) => a.kind === kind && a.at < killedAt).length, kind).toBeGreaterThan(0);
		expect(acks.filter((a) => a.kind === kind && a.at > restartedAt).length, kind).toBeGreaterThan(
			0
		);
	}

	// 1. Every acknowledged write is there.
	const forkSet = new Set(
		sql(`SELECT id FROM builds WHERE id > ${buildsBefore}`).map(([id]) => Number(id))
	);
	const missingForks = ackedForks.filter((id) => !forkSet.has(id));
	expect(missingForks, 'acknowledged forks missing').toEqual([]);
	const lostEdits: number[] = [];
	for (const [id, edit] of ackedEdits) {
		const [version, title] = sql(`SELECT version, title FROM builds WHERE id = ${id}`)[0] ?? [];
		// A later edit may have committed without its answer: then the version is higher.
		if (!(
			Number(version) > edit.version ||
			(Number(version) === edit.version && title === edit.title)
		))
			lostEdits.push(id);
	}
	expect(lostEdits, 'acknowledged build edits lost').toEqual([]);
	const lastDraft = ackedDrafts.at(-1)!;
	// A draft's details live on its newest revision; the guide row keeps the published copy.
	const [draftVersion, draftSummary] =
		sql(
			`SELECT g.version, r.summary FROM guides g JOIN guide_revisions r ON r.guide_id = g.id
			 WHERE g.slug = '${FORKED}' ORDER BY r.number DESC LIMIT 1`
		)[0] ?? [];
	expect(
		Number(draftVersion) > lastDraft.version ||
			(Number(draftVersion) === lastDraft.version && draftSummary === lastDraft.summary),
		`last acknowledged draft save (version ${lastDraft.version}) is there`
	).toBe(true);
	const verified = new Set(
		sql("SELECT id FROM price_sightings WHERE state = 'verified' AND quote_id IS NOT NULL").map(
			([id]) => Number(id)
		)
	);
	expect(
		ackedDecisions.filter((id) => !verified.has(id)),
		'acknowledged decisions lost'
	).toEqual([]);
	const onNewRevision = new Set(
		sql(
			`SELECT id FROM builds WHERE base_revision_id = ${newRevision} AND id > ${buildsBefore}`
		).map(([id]) => Number(id))
	);
	expect(
		ackedSyncs.filter((id) => !onNewRevision.has(id)),
		'acknowledged syncs lost'
	).toEqual([]);

	// 2. Nothing is half-written.
	// Every build made in this run has exactly the slots of the revision it is based on
	// (forks and syncs took every slot; title edits change no slot).
	const slotMismatches = sql(`
		SELECT b.id FROM builds b
		WHERE b.id > ${buildsBefore} AND (
			(SELECT GROUP_CONCAT(CONCAT(s.label, ':', s.part_id, ':', s.quantity) ORDER BY s.label, s.part_id)
				FROM build_slots s WHERE s.build_id = b.id)
			<=> (SELECT GROUP_CONCAT(CONCAT(g.label, ':', g.pick_part_id, ':', g.quantity) ORDER BY g.label, g.pick_part_id)
				FROM guide_slots g WHERE g.revision_id = b.base_revision_id)
		) = 0`);
	expect(slotMismatches, 'builds whose slots differ from their revision').toEqual([]);
	const emptyBuilds = one(
		`SELECT COUNT(*) FROM builds b WHERE b.id > ${buildsBefore} AND NOT EXISTS (SELECT 1 FROM build_slots s WHERE s.build_id = b.id)`
	);
	expect(emptyBuilds).toBe('0');
	// A sync moves the base revision, bumps the version and logs itself, all or nothing.
	const halfSyncs = sql(`
		SELECT b.id FROM builds b
		WHERE b.id IN (${syncForks.join(',')}) AND NOT (
			(b.base_revision_id = ${oldRevision} AND b.version = 1
				AND NOT EXISTS (SELECT 1 FROM build_syncs y WHERE y.build_id = b.id))
			OR (b.base_revision_id = ${newRevision} AND b.version = 2
				AND (SELECT COUNT(*) FROM build_syncs y WHERE y.build_id = b.id AND y.to_revision_id = ${newRevision}) = 1)
		)`);
	expect(halfSyncs, 'syncs half-written').toEqual([]);
	// A decision is the sighting's state, its quote and its audit event, all or nothing.
	const halfDecisions = sql(`
		SELECT p.id FROM price_sightings p
		WHERE (p.state = 'verified') <> (p.quote_id IS NOT NULL)
			OR (p.state = 'verified' AND (
				NOT EXISTS (SELECT 1 FROM quotes q WHERE q.id = p.quote_id AND q.source = 'sighting')
				OR (SELECT COUNT(*) FROM audit_events a
					WHERE a.action = 'price_sighting.verified' AND a.subject_id = p.id) <> 1))`);
	expect(halfDecisions, 'decisions half-written').toEqual([]);
	const verifiedCount = Number(
		one("SELECT COUNT(*) FROM price_sightings WHERE state = 'verified'")
	);
	expect(
		Number(one("SELECT COUNT(*) FROM quotes WHERE source = 'sighting'")) - sightingQuotesBefore
	).toBe(verifiedCount);

	// The figures.
	const count = (kind: string, when: (a: Ack) => boolean = () => true) =>
		acks.filter((a) => a.kind === kind && when(a)).length;
	const rows = kinds.map(
		(k) =>
			`| ${k} | ${count(k, (a) => a.at < killedAt)} | ${count(k, (a) => a.at >= killedAt)} | ${failures[k] ?? 0} | 0 |`
	);
	writeReliabilitySection('crash', [
		runNote(),
		'',
		`Settings asserted: \`innodb_flush_log_at_trx_commit=1\`, \`sync_binlog=1\`, \`log_bin=ON\`, \`innodb_doublewrite=ON\`.`,
		'',
		'| write (through the HTTP API) | acknowledged before the kill | acknowledged after | refused or failed while down | lost |',
		'| --- | ---: | ---: | ---: | ---: |',
		...rows,
		`| **all** | ${acksBeforeKill} | ${acks.length - acksBeforeKill} | ${Object.values(failures).reduce((a, b) => a + b, 0)} | **0** |`,
		'',
		`mariadbd was killed ${((killedAt - started) / 1000).toFixed(1)} s into the stream and started again 0.5 s later;`,
		`\`scripts/db.sh start\` (crash recovery included) returned ${((restartedAt - killedAt) / 1000).toFixed(1)} s after the kill, and`,
		`the longest stretch with no write acknowledged was ${(longestGapMs / 1000).toFixed(1)} s; the app was not restarted.`,
		`Checked whole afterwards: ${forkSet.size} builds made in the run (slots equal to their revision's),`,
		`${syncForks.length} forks offered a sync (each either untouched or moved, versioned and logged), ${verifiedCount}`,
		'verified sightings (each with its quote and one audit event). Half-written: **0**.'
	]);
});

interface DraftView {
	version: number;
	title: string;
	summary: string;
	targetBudget: string;
	baseRegion: string;
	tags: string[];
	disclosure: string;
	disclosureNote: string | null;
	walkthroughUrl: string | null;
	buildNotes: Record<string, string>;
	slots: {
		category: string;
		label: string;
		quantity: number;
		pickPartId: number;
		reason: string;
		priceQuote: unknown;
		alternates: { partId: number; reasonTag: string; note: string }[];
	}[];
}

/** The PUT body for a draft as GET returned it (the fields saveDraftInput accepts). */
function draftBody(
	draft: DraftView,
	pick: (slot: DraftView['slots'][number]) => DraftView['slots'][number] = (s) => s
) {
	return {
		title: draft.title,
		summary: draft.summary,
		targetBudget: draft.targetBudget,
		baseRegion: draft.baseRegion,
		tags: draft.tags,
		disclosure: draft.disclosure,
		disclosureNote: draft.disclosureNote,
		walkthroughUrl: draft.walkthroughUrl,
		buildNotes: draft.buildNotes,
		slots: draft.slots.map(pick).map((s) => ({
			category: s.category,
			label: s.label,
			quantity: s.quantity,
			pickPartId: s.pickPartId,
			reason: s.reason,
			priceQuote: s.priceQuote,
			alternates: s.alternates.map((a) => ({
				partId: a.partId,
				reasonTag: a.reasonTag,
				note: a.note
			}))
		}))
	};
}

/** The guide's author promotes the graphics card's first alternate and submits; an editor approves. */
async function publishNewRevision(origin: string, author: string, editor: string): Promise<void> {
	const draft = (await (
		await api(origin, 'GET', `/api/v1/guides/${SYNCED}/draft`, author)
	).json()) as DraftView;
	const body = draftBody(draft, (s) => {
		const first = s.alternates[0];
		if (s.label !== 'Graphics card' || !first) return s;
		return {
			...s,
			pickPartId: first.partId,
			priceQuote: null,
			alternates: [
				{ partId: s.pickPartId, reasonTag: 'lower_price', note: 'The previous pick.' },
				...s.alternates.slice(1)
			]
		};
	});
	const saved = await api(origin, 'PUT', `/api/v1/guides/${SYNCED}/draft`, author, {
		...body,
		version: draft.version
	});
	expect(saved.status, await saved.clone().text()).toBe(200);
	const submitted = await api(origin, 'POST', `/api/v1/guides/${SYNCED}/submit`, author, {
		version: ((await saved.json()) as { version: number }).version
	});
	expect(submitted.status).toBe(200);
	const revision = one(
		`SELECT r.id FROM guide_revisions r JOIN guides g ON g.id = r.guide_id
		 WHERE g.slug = '${SYNCED}' AND r.submitted_at IS NOT NULL AND r.reviewed_at IS NULL`
	);
	const approved = await postForm(
		origin,
		`/review/${revision}?/decide`,
		// The review page asks "Yes, publish now" before publishing: the form sends confirmed=yes.
		{ decision: 'approve', note: '', confirmed: 'yes' },
		editor
	);
	expect(approved.status).toBe(200);
}
