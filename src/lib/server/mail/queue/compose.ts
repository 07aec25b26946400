/*
 * Turns a claimed job into the message to send. 'message' jobs carry it whole; 'mailing'
 * jobs carry one recipient's values (their region's total and their signed links) and are
 * rendered here with the mailing's own subject and intro, so ten thousand recipients cost
 * one row of content and ten thousand small payloads. Relative imports only (worker).
 */
import { z } from 'zod';
import { Guide, Mailing, User } from '../../db/models/index.js';
import { newsletterMailing } from '../newsletter-templates.js';
import type { MailTemplate } from '../templates.js';

export interface ComposedMessage {
	message: MailTemplate;
	headers?: Record<string, string>;
}

const messagePayload = z.object({
	subject: z.string(),
	text: z.string(),
	html: z.string(),
	headers: z.record(z.string(), z.string()).optional()
});

/** What services/mailings.ts puts in each recipient's job. */
export const mailingPayload = z.object({
	regionCode: z.string(),
	regionName: z.string(),
	totalText: z.string().nullable(),
	quoted: z.number().int(),
	estimated: z.number().int(),
	unpriced: z.number().int(),
	manageToken: z.string(),
	unsubscribeToken: z.string()
});
export type MailingPayload = z.infer<typeof mailingPayload>;

interface MailingContentRow {
	subject: string;
	intro: string;
	origin: string;
	guide: { slug: string; title: string; summary: string; authorName: string };
}

/** Mailing content by id, loaded once per worker and mailing (it cannot change once sending). */
export class MailingContentCache {
	private readonly rows = new Map<number, Promise<MailingContentRow>>();

	get(mailingId: number): Promise<MailingContentRow> {
		let row = this.rows.get(mailingId);
		if (!row) {
			row = load(mailingId);
			row.catch(() => this.rows.delete(mailingId));
			this.rows.set(mailingId, row);
		}
		return row;
	}
}

async function load(mailingId: number): Promise<MailingContentRow> {
	const mailing = (await Mailing.findByPk(mailingId, {
		include: [
			{
				model: Guide,
				as: 'guide',
				attributes: ['slug', 'title', 'summary'],
				include: [{ model: User, as: 'author', attributes: ['name'] }]
			}
		]
	})) as (Mailing & { guide?: Guide & { author?: User | null } }) | null;
	if (!mailing?.guide || !mailing.linkOrigin)
		throw new Error(`mailing ${mailingId} has no guide or no link origin`);
	return {
		subject: mailing.subject,
		intro: mailing.intro,
		origin: mailing.linkOrigin,
		guide: {
			slug: mailing.guide.slug,
			title: mailing.guide.title,
			summary: mailing.guide.summary,
			authorName: mailing.guide.author?.name ?? 'a Slotwise author'
		}
	};
}

function pageUrl(origin: string, path: string, params: Record<string, string>): string {
	const url = new URL(path, origin);
	for (const [k, v] of Object.entries(params)) url.searchParams.set(k, v);
	return url.href;
}

/**
 * The recipient's copy of a mailing and its list headers: List-Unsubscribe (RFC 2369) with
 * the one-click address, and List-Unsubscribe-Post (RFC 8058, docs/sources.md 12).
 */
export function renderMailing(content: MailingContentRow, p: MailingPayload): ComposedMessage {
	const unsubscribeUrl = pageUrl(content.origin, '/newsletter/unsubscribe', {
		token: p.unsubscribeToken
	});
	const message = newsletterMailing({
		subject: content.subject,
		intro: content.intro,
		guide: {
			title: content.guide.title,
			authorName: content.guide.authorName,
			summary: content.guide.summary,
			url: pageUrl(content.origin, `/guides/${content.guide.slug}`, { region: p.regionCode })
		},
		price: {
			regionName: p.regionName,
			totalText: p.totalText,
			quoted: p.quoted,
			estimated: p.estimated,
			unpriced: p.unpriced
		},
		manageUrl: pageUrl(content.origin, '/newsletter/manage', { token: p.manageToken }),
		unsubscribeUrl
	});
	return {
		message,
		headers: {
			'List-Unsubscribe': `<${unsubscribeUrl}>`,
			'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click'
		}
	};
}

export async function compose(
	job: { kind: string; mailingId: number | null; payload: unknown },
	cache: MailingContentCache
): Promise<ComposedMessage> {
	const payload = typeof job.payload === 'string' ? JSON.parse(job.payload) : job.payload;
	if (job.kind === 'message') {
		const p = messagePayload.parse(payload);
		return {
			message: { subject: p.subject, text: p.text, html: p.html },
			...(p.headers ? { headers: p.headers } : {})
		};
	}
	if (job.kind === 'mailing' && job.mailingId !== null) {
		return renderMailing(await cache.get(job.mailingId), mailingPayload.parse(payload));
	}
	throw new Error(`unknown mail job kind ${job.kind}`);
}
