import { fail, redirect } from '@sveltejs/kit';
import { catalogImportIdInput as importIdInput } from '$lib/schemas/catalog-upkeep';
import { fieldIssues } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import * as catalogCsv from '$lib/server/services/catalog-csv';
import { CSV_TOO_LARGE_MESSAGE } from '$lib/server/services/catalog-csv-limits';
import type { Actions, PageServerLoad } from './$types';

// Room for the multipart envelope around a file of the largest accepted size.
const MAX_REQUEST_BYTES = catalogCsv.MAX_UPLOAD_BYTES + 64 * 1024;

export const load: PageServerLoad = async ({ url }) => {
	const me = requireRole('editor');
	const id = url.searchParams.get('id');
	const preview = id ? await catalogCsv.preview(me.id, id) : null;
	return {
		preview,
		// An id that leads nowhere: expired, already imported, discarded, or someone else's.
		previewMissing: id !== null && preview === null,
		maxMb: catalogCsv.MAX_UPLOAD_BYTES / 1024 / 1024,
		maxRows: catalogCsv.MAX_ROWS
	};
};

export const actions: Actions = {
	upload: async ({ request }) => {
		const me = requireRole('editor');
		const length = Number(request.headers.get('content-length') ?? 0);
		if (length > MAX_REQUEST_BYTES) {
			return fail(413, { issues: { file: [CSV_TOO_LARGE_MESSAGE] } });
		}
		const file = (await request.formData()).get('file');
		if (!(file instanceof File) || file.size === 0) {
			return fail(400, { issues: { file: ['Choose a CSV file to upload.'] } });
		}
		const outcome = await catalogCsv.upload(
			me.id,
			new Uint8Array(await file.arrayBuffer()),
			file.name
		);
		if (outcome.kind === 'invalid') return fail(400, { report: outcome });
		redirect(303, `/editor/parts/import?id=${outcome.importId}`);
	},

	confirm: async ({ request }) => {
		const me = requireRole('editor');
		const input = importIdInput.safeParse(Object.fromEntries(await request.formData()));
		if (!input.success) return fail(400, { issues: fieldIssues(input.error) });
		const outcome = await catalogCsv.commit(me.id, input.data.importId);
		if (outcome.kind === 'not_found') {
			return fail(404, {
				message: 'This upload has expired or was already imported. Upload the file again.'
			});
		}
		if (outcome.kind === 'conflict') {
			return fail(409, {
				message: outcome.message,
				report: {
					kind: 'invalid' as const,
					fileName: '',
					totalRows: 0,
					goodRows: 0,
					badRows: 0,
					problems: outcome.problems,
					moreProblems: 0
				}
			});
		}
		return {
			committed: {
				created: outcome.created,
				updated: outcome.updated,
				unchanged: outcome.unchanged
			}
		};
	},

	discard: async ({ request }) => {
		const me = requireRole('editor');
		const input = importIdInput.safeParse(Object.fromEntries(await request.formData()));
		if (!input.success) return fail(400, { issues: fieldIssues(input.error) });
		await catalogCsv.discard(me.id, input.data.importId);
		redirect(303, '/editor/parts/import');
	}
};
