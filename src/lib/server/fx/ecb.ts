/*
 * The European Central Bank's daily euro foreign exchange reference rates, in the XML layout
 * the ECB publishes (eurofxref-daily.xml):
 *
 *   <gesmes:Envelope …>
 *     <Cube>
 *       <Cube time='2024-01-02'>
 *         <Cube currency='USD' rate='1.0956'/>   (units of the currency per 1 EUR)
 *
 * The URL comes from ECB_RATES_URL (development and tests point it at the local fake,
 * scripts/ecb-fake.ts); without it, the ECB's public daily URL. Rates stay decimal strings
 * exactly as published: no float ever holds one.
 *
 * Relative imports and plain process.env only, so scripts can use this module too.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { z } from 'zod';
import { isoDate } from '../../schemas/primitives.js';

export const ECB_DAILY_URL = 'https://www.ecb.europa.eu/stats/eurofxref/eurofxref-daily.xml';

/** The whole exchange (connect, headers, body) must finish within this; the ECB answers in well under a second. */
export const DEFAULT_TIMEOUT_MS = 5_000;

/** The real daily file is about 1.5 KB; anything near this is not that file. */
const MAX_BODY_BYTES = 512 * 1024;

export interface EcbDailyRates {
	/** YYYY-MM-DD: the day the reference rates were published for. */
	asOf: string;
	/** ISO 4217 code → units per 1 EUR, as the published decimal string. */
	rates: Record<string, string>;
}

export type EcbErrorReason =
	'config' | 'unreachable' | 'timeout' | 'http' | 'too-large' | 'malformed' | 'unexpected-shape';

/** Fetching or reading the rates failed; `reason` says at which stage, the message says what to do. */
export class EcbRatesError extends Error {
	override readonly name = 'EcbRatesError';
	constructor(
		readonly reason: EcbErrorReason,
		message: string
	) {
		super(message);
	}
}

/** The URL the client fetches: ECB_RATES_URL when set, else the ECB's public daily file. */
export function ecbRatesUrl(env: NodeJS.ProcessEnv = process.env): string {
	return env.ECB_RATES_URL?.trim() || ECB_DAILY_URL;
}

const rateDate = isoDate({
	missing: 'time is missing',
	shape: 'time must be a date as YYYY-MM-DD',
	real: 'time must be a real calendar date'
});

const rateCube = z.object({
	currency: z
		.string({ error: 'currency is missing' })
		.regex(/^[A-Z]{3}$/, 'currency must be a three-letter ISO 4217 code')
		.refine((c) => c !== 'EUR', { message: 'EUR is the base of the table and cannot have a rate' }),
	// Plain decimals as the ECB writes them; at most 12 integer and 6 decimal digits (fits DECIMAL(18, 6)).
	rate: z
		.string({ error: 'rate is missing' })
		.regex(
			/^\d{1,12}(\.\d{1,6})?$/,
			'rate must be a plain decimal such as 1.0956 (no sign, at most 6 decimals)'
		)
		.refine((r) => /[1-9]/.test(r), { message: 'rate must be greater than zero' })
});

const dayCube = z.object(
	{
		time: rateDate,
		Cube: z
			.array(rateCube, { error: 'a day needs at least one rate' })
			.min(1, 'a day needs at least one rate')
	},
	{ error: 'expected a dated Cube element' }
);

const envelope = z.object({
	Envelope: z.object(
		{
			Cube: z
				.array(
					z.object(
						{
							Cube: z
								.array(dayCube, { error: 'no dated Cube element' })
								.min(1, 'no dated Cube element')
						},
						{ error: 'no dated Cube element' }
					),
					{ error: 'no Cube element' }
				)
				.length(1, 'expected exactly one outer Cube element')
		},
		{ message: 'not a gesmes:Envelope document' }
	)
});

const parser = new XMLParser({
	ignoreAttributes: false,
	attributeNamePrefix: '',
	removeNSPrefix: true,
	// Keep "382.10" as the string "382.10", never the number 382.1.
	parseAttributeValue: false,
	parseTagValue: false,
	// The file declares no entities; refusing to expand any closes entity-expansion tricks.
	processEntities: false,
	isArray: (tagName) => tagName === 'Cube'
});

/**
 * Reads the ECB's daily XML. A file with several dated blocks (the ECB's 90-day history has
 * the same layout) yields the newest day. Throws EcbRatesError ('malformed' for XML that is
 * not well-formed, 'unexpected-shape' for well-formed XML that is not the rates layout).
 */
export function parseEcbDailyXml(xml: string): EcbDailyRates {
	const valid = XMLValidator.validate(xml);
	if (valid !== true) {
		throw new EcbRatesError(
			'malformed',
			`The exchange-rate file is not well-formed XML: ${valid.err.msg} (line ${valid.err.line}, column ${valid.err.col})`
		);
	}
	const parsed = envelope.safeParse(parser.parse(xml));
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		const where = issue && issue.path.length > 0 ? ` at ${issue.path.join('.')}` : '';
		throw new EcbRatesError(
			'unexpected-shape',
			`The exchange-rate file does not have the ECB reference-rate layout${where}: ${issue?.message ?? 'unknown problem'}`
		);
	}
	const days = parsed.data.Envelope.Cube[0]?.Cube ?? [];
	const newest = days.reduce((a, b) => (b.time > a.time ? b : a));
	const rates: Record<string, string> = {};
	for (const { currency, rate } of newest.Cube) {
		if (currency in rates) {
			throw new EcbRatesError(
				'unexpected-shape',
				`The exchange-rate file lists ${currency} twice for ${newest.time}`
			);
		}
		rates[currency] = rate;
	}
	return { asOf: newest.time, rates };
}

async function readCapped(response: Response, url: string): Promise<string> {
	const declared = Number(response.headers.get('content-length') ?? 0);
	if (declared > MAX_BODY_BYTES) {
		throw new EcbRatesError(
			'too-large',
			`${url} sent ${declared} bytes; the rates file is a few kilobytes`
		);
	}
	if (!response.body) return '';
	const reader = response.body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		size += value.byteLength;
		if (size > MAX_BODY_BYTES) {
			await reader.cancel();
			throw new EcbRatesError(
				'too-large',
				`${url} sent more than ${MAX_BODY_BYTES} bytes; the rates file is a few kilobytes`
			);
		}
		chunks.push(value);
	}
	return new TextDecoder('utf-8', { fatal: false }).decode(Buffer.concat(chunks));
}

function isTimeout(e: unknown): boolean {
	return e instanceof Error && (e.name === 'TimeoutError' || e.name === 'AbortError');
}

export interface FetchOptions {
	/** Defaults to ecbRatesUrl(). */
	url?: string;
	timeoutMs?: number;
}

/**
 * Fetches and parses the daily reference rates. Every failure is an EcbRatesError naming the
 * URL and the stage, so an editor's "refresh" can say what went wrong.
 */
export async function fetchEcbDailyRates({
	url = ecbRatesUrl(),
	timeoutMs = DEFAULT_TIMEOUT_MS
}: FetchOptions = {}): Promise<EcbDailyRates> {
	let target: URL;
	try {
		target = new URL(url);
	} catch {
		throw new EcbRatesError('config', `ECB_RATES_URL is not a URL: "${url}"`);
	}
	if (target.protocol !== 'http:' && target.protocol !== 'https:') {
		throw new EcbRatesError(
			'config',
			`ECB_RATES_URL must be http or https, got ${target.protocol}`
		);
	}
	const signal = AbortSignal.timeout(timeoutMs);
	try {
		const response = await fetch(target, {
			signal,
			redirect: 'follow',
			headers: { accept: 'application/xml, text/xml;q=0.9' }
		});
		if (!response.ok) {
			await response.body?.cancel();
			throw new EcbRatesError('http', `${url} answered HTTP ${response.status}`);
		}
		return parseEcbDailyXml(await readCapped(response, url));
	} catch (e) {
		if (e instanceof EcbRatesError) throw e;
		if (isTimeout(e) || signal.aborted) {
			throw new EcbRatesError('timeout', `${url} did not answer within ${timeoutMs} ms`);
		}
		const cause = e instanceof Error && e.cause instanceof Error ? `: ${e.cause.message}` : '';
		throw new EcbRatesError('unreachable', `Could not reach ${url}${cause}`);
	}
}
