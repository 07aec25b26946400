import { fail, redirect } from '@sveltejs/kit';
import { formFields } from '$lib/schemas/account';
import { storeIdInput } from '$lib/schemas/catalog-upkeep';
import { fieldIssues } from '$lib/schemas/issues';
import { requireRole } from '$lib/server/auth/guards';
import * as catalogReads from '$lib/server/services/catalog-reads';
import * as catalogStores from '$lib/server/services/catalog-stores';
import type { Actions, PageServerLoad } from './$types';
import type { Issues } from '$lib/schemas/issues';

export const load: PageServerLoad = async ({ url }) => {
	requireRole('editor');
	const [stores, regions] = await Promise.all([
		catalogReads.listStores(),
		catalogReads.regionOptions()
	]);
	const editId = Number(url.searchParams.get('edit'));
	const editing = stores.find((s) => s.id === editId) ?? null;
	return { stores, regions, editing, done: url.searchParams.get('done') };
};

export const actions: Actions = {
	create: async ({ request }) => {
		const me = requireRole('editor');
		const fields = formFields(await request.formData());
		const outcome = await catalogStores.createStore(me.id, fields);
		if (outcome.kind === 'invalid')
			return fail(400, { action: 'create' as const, issues: outcome.issues, values: fields });
		if (outcome.kind !== 'ok')
			return fail(409, {
				action: 'create' as const,
				issues: { _form: ['The store could not be added.'] } as Issues,
				values: fields
			});
		redirect(303, '/editor/stores?done=added');
	},

	update: async ({ request }) => {
		const me = requireRole('editor');
		const { storeId: rawId, ...fields } = formFields(await request.formData());
		const id = storeIdInput.safeParse({ storeId: rawId });
		if (!id.success)
			return fail(400, {
				action: 'update' as const,
				issues: fieldIssues(id.error),
				values: fields
			});
		const outcome = await catalogStores.updateStore(me.id, id.data.storeId, fields);
		if (outcome.kind === 'invalid')
			return fail(400, {
				action: 'update' as const,
				storeId: id.data.storeId,
				issues: outcome.issues,
				values: fields
			});
		if (outcome.kind === 'not_found')
			return fail(404, {
				action: 'update' as const,
				issues: { _form: ['That store no longer exists.'] } as Issues,
				values: fields
			});
		if (outcome.kind !== 'ok')
			return fail(409, {
				action: 'update' as const,
				issues: { _form: ['The store could not be saved.'] } as Issues,
				values: fields
			});
		redirect(303, '/editor/stores?done=saved');
	},

	delete: async ({ request }) => {
		const me = requireRole('editor');
		const id = storeIdInput.safeParse(formFields(await request.formData()));
		if (!id.success) return fail(400, { action: 'delete' as const, message: 'Unknown store.' });
		const outcome = await catalogStores.deleteStore(me.id, id.data.storeId);
		if (outcome.kind === 'not_found')
			return fail(404, { action: 'delete' as const, message: 'That store no longer exists.' });
		if (outcome.kind === 'conflict')
			return fail(409, { action: 'delete' as const, message: outcome.message });
		redirect(303, '/editor/stores?done=removed');
	}
};
