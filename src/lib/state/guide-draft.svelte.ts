import { getContext, setContext } from 'svelte';
import { applyOp, moveSlot } from '$lib/schemas/guide-editor-form';
import type { EditorDraft } from '$lib/schemas/guide-editor-form';
import type { Issues } from '$lib/schemas/issues';
import type { EditorCatalog } from '$lib/views';

/**
 * The guide editor's working copy, shared by its section components through context.
 * Operations are the same pure functions the no-JS ?/edit action applies.
 */
export class GuideDraftState {
	draft = $state() as EditorDraft;
	issues = $state<Issues>({});
	readonly catalog: EditorCatalog;

	constructor(initial: EditorDraft, catalog: EditorCatalog, issues: Issues = {}) {
		this.draft = initial;
		this.catalog = catalog;
		this.issues = issues;
	}

	apply(op: string) {
		this.draft = applyOp(this.draft, op);
	}

	move(from: number, to: number) {
		this.draft = moveSlot(this.draft, from, to);
	}

	issuesFor(path: string): string[] {
		return this.issues[path] ?? [];
	}

	partsOf(category: string) {
		return this.catalog.parts.filter((p) => p.category === category);
	}

	partName(id: string | number): string {
		const part = this.catalog.parts.find((p) => String(p.id) === String(id));
		return part ? `${part.brand} ${part.model}` : '';
	}
}

const KEY = Symbol('guide-draft');
export function setGuideDraft(state: GuideDraftState): GuideDraftState {
	return setContext(KEY, state);
}
export function getGuideDraft(): GuideDraftState {
	return getContext<GuideDraftState>(KEY);
}
