/**
 * Readers tip guide authors (issue 20): the tip form's data, starting a checkout at the
 * payment provider, the thank-you page and the author's tip settings. The ledger's later
 * changes (webhooks, refunds) are in tip-ledger.ts, the author's figures in tip-earnings.ts.
 *
 * A tip opens a Checkout Session through the provider's SDK and stores one pending ledger row
 * for it; the reader pays on the provider's page, so no card data ever reaches Slotwise.
 */
import { Op } from 'sequelize';
import { formatMoney, money } from '$lib/domain/money';
import { describeLimits, tipLimits, type TipStatus } from '$lib/domain/tips';
import type { TipInput, TipSettingsInput } from '$lib/schemas/tips';
import { Build, Guide, Region, Tip, TipSettings, User } from '$lib/server/db';
import { paymentsAvailable, provider } from '$lib/server/payments/provider';

export interface TipTarget {
	guide: { id: number; slug: string; title: string };
	author: { id: string; name: string };
	tipsEnabled: boolean;
	/** Every currency of Slotwise's regions that takes tips, with its presets and limits. */
	currencies: { code: string; presetsMinor: number[]; presetLabels: string[]; limits: string }[];
	/** The reader's region currency (?region=, else the guide's base region). */
	currency: string;
}

async function publishedGuide(slug: string) {
	const guide = (await Guide.findOne({
		where: { slug, state: 'published', hiddenAt: null, authorId: { [Op.ne]: null } },
		include: [
			{ model: User, as: 'author', attributes: ['id', 'name', 'disabledAt'] },
			{ model: Region, as: 'baseRegion', attributes: ['code', 'currency'] }
		]
	})) as (Guide & { author?: User | null; baseRegion?: Region | null }) | null;
	if (!guide?.author || guide.author.disabledAt) return null;
	return guide;
}

async function settingsOf(userId: string) {
	const row = await TipSettings.findByPk(userId);
	return { tipsEnabled: row?.tipsEnabled ?? true, thankYouMessage: row?.thankYouMessage ?? '' };
}

/** The tip form for a published guide, or null when there is no such guide. */
export async function tipTarget(
	slug: string,
	regionCode: string | null
): Promise<TipTarget | null> {
	const guide = await publishedGuide(slug);
	if (!guide?.author) return null;
	const regions = await Region.findAll({
		attributes: ['code', 'currency'],
		order: [['code', 'ASC']]
	});
	const codes = [...new Set(regions.map((r) => r.currency))].filter((c) => tipLimits(c)).sort();
	const wanted = regions.find((r) => r.code === regionCode)?.currency;
	const base = guide.baseRegion?.currency;
	const currency =
		[wanted, base, codes[0]].find((c): c is string => !!c && codes.includes(c)) ?? 'EUR';
	return {
		guide: { id: guide.id, slug: guide.slug, title: guide.title },
		author: { id: guide.author.id, name: guide.author.name ?? 'The author' },
		tipsEnabled: (await settingsOf(guide.author.id)).tipsEnabled,
		currency,
		currencies: codes.map((code) => {
			const presetsMinor = tipLimits(code)?.presetsMinor ?? [];
			return {
				code,
				presetsMinor,
				presetLabels: presetsMinor.map((m) => formatMoney(money(m, code))),
				limits: describeLimits(code)
			};
		})
	};
}

export type StartTipResult =
	| { kind: 'ok'; checkoutUrl: string }
	| { kind: 'not_found' }
	| { kind: 'refused'; message: string };

/**
 * Opens a checkout for `input` and stores its pending ledger row. `origin` builds the
 * return addresses the provider sends the reader back to.
 */
export async function startTip(
	supporter: { id: string; email: string },
	slug: string,
	input: TipInput,
	origin: string
): Promise<StartTipResult> {
	const guide = await publishedGuide(slug);
	if (!guide?.author) return { kind: 'not_found' };
	if (guide.author.id === supporter.id)
		return { kind: 'refused', message: 'You cannot tip yourself.' };
	if (!(await settingsOf(guide.author.id)).tipsEnabled)
		return {
			kind: 'refused',
			message: `${guide.author.name ?? 'This author'} does not take tips just now.`
		};
	if (!paymentsAvailable())
		return { kind: 'refused', message: 'Tips are not available on this installation.' };
	if (input.buildId !== null) {
		const build = await Build.findOne({
			where: { id: input.buildId, ownerId: supporter.id, sourceGuideId: guide.id }
		});
		if (!build)
			return { kind: 'refused', message: 'That build is not yours or not from this guide.' };
	}
	const session = await provider().checkout.sessions.create(
		{
			mode: 'payment',
			line_items: [
				{
					quantity: 1,
					price_data: {
						currency: input.currency.toLowerCase(),
						// Minor units, exactly as the provider counts them (JPY has none).
						unit_amount: input.amountMinor,
						product_data: { name: `Tip for “${guide.title}”` }
					}
				}
			],
			customer_email: supporter.email,
			success_url: `${origin}/tips/thanks?session_id={CHECKOUT_SESSION_ID}`,
			cancel_url: `${origin}/guides/${guide.slug}/tip?cancelled=1`,
			metadata: { guide: guide.slug }
		},
		{ idempotencyKey: `slotwise-tip-${crypto.randomUUID()}` }
	);
	if (!session.url)
		return { kind: 'refused', message: 'The payment provider did not open a checkout.' };
	await Tip.create({
		supporterId: supporter.id,
		authorId: guide.author.id,
		guideId: guide.id,
		buildId: input.buildId,
		amountMinor: input.amountMinor,
		currency: input.currency,
		checkoutSessionId: session.id,
		note: input.note,
		anonymous: input.anonymous
	});
	return { kind: 'ok', checkoutUrl: session.url };
}

export interface ThankYou {
	status: TipStatus;
	amount: string;
	guide: { slug: string; title: string } | null;
	authorName: string;
	thankYouMessage: string;
	note: string | null;
	anonymous: boolean;
}

/** The supporter's own tip, by the checkout session the provider sent them back with. */
export async function thankYou(supporterId: string, sessionId: string): Promise<ThankYou | null> {
	const tip = (await Tip.findOne({
		where: { checkoutSessionId: sessionId, supporterId },
		include: [
			{ model: Guide, as: 'guide', attributes: ['slug', 'title'] },
			{ model: User, as: 'author', attributes: ['id', 'name'] }
		]
	})) as (Tip & { guide?: Guide | null; author?: User | null }) | null;
	if (!tip) return null;
	const settings = tip.author ? await settingsOf(tip.author.id) : null;
	return {
		status: tip.status,
		amount: formatMoney(money(tip.amountMinor, tip.currency)),
		guide: tip.guide ? { slug: tip.guide.slug, title: tip.guide.title } : null,
		authorName: tip.author?.name ?? 'The author',
		thankYouMessage: settings?.thankYouMessage ?? '',
		note: tip.note,
		anonymous: tip.anonymous
	};
}

export async function getSettings(userId: string) {
	return settingsOf(userId);
}

export async function saveSettings(userId: string, input: TipSettingsInput): Promise<void> {
	await TipSettings.upsert({
		userId,
		tipsEnabled: input.tipsEnabled,
		thankYouMessage: input.thankYouMessage
	});
}

export interface PublicNote {
	id: number;
	from: string;
	note: string;
	amount: string;
	/** ISO date (UTC) of the payment. */
	date: string;
}

/** Paid tips' public notes on a guide, newest first; hidden notes are left out. */
export async function publicNotes(guideId: number, limit = 20): Promise<PublicNote[]> {
	const rows = (await Tip.findAll({
		where: { guideId, status: 'paid', noteHiddenAt: null, note: { [Op.ne]: null } },
		include: [{ model: User, as: 'supporter', attributes: ['name'] }],
		order: [['paidAt', 'DESC']],
		limit
	})) as (Tip & { supporter?: User | null })[];
	return rows.map((t) => ({
		id: t.id,
		from: t.anonymous ? 'Anonymous' : (t.supporter?.name ?? 'A reader'),
		note: t.note ?? '',
		amount: formatMoney(money(t.amountMinor, t.currency)),
		date: (t.paidAt ?? t.createdAt).toISOString().slice(0, 10)
	}));
}

/** What the guide page shows about tips: whether the author takes them, and the public notes. */
export async function guideTipPanel(
	slug: string
): Promise<{ tipsOpen: boolean; tipNotes: PublicNote[] }> {
	const guide = await publishedGuide(slug);
	if (!guide?.author) return { tipsOpen: false, tipNotes: [] };
	const [settings, notes] = await Promise.all([settingsOf(guide.author.id), publicNotes(guide.id)]);
	return { tipsOpen: settings.tipsEnabled && paymentsAvailable(), tipNotes: notes };
}
