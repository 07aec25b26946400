/*
 * Reads the part form (new and edit pages): the plain fields, and the specs through the
 * category's generated field list, so only fields of that schema are ever read.
 */
import type { PartCategory } from '$lib/domain/types';
import { formFields } from '$lib/schemas/account';
import { specFields, specsFromForm } from '$lib/schemas/spec-form';

export interface PartFormValues {
	brand: string;
	model: string;
	slug: string;
	specs: Record<string, unknown>;
}

export function readPartForm(data: FormData, category: PartCategory): PartFormValues {
	const fields = formFields(data);
	const specs = specsFromForm(specFields(category), (name) =>
		data.getAll(name).filter((v): v is string => typeof v === 'string')
	);
	return { brand: fields.brand ?? '', model: fields.model ?? '', slug: fields.slug ?? '', specs };
}
