import { getContext, setContext } from 'svelte';
import { SvelteMap } from 'svelte/reactivity';
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
	/** Names of the parts this page has met (id → "Brand Model"): never the whole catalog. */
	readonly #names = new SvelteMap<string, string>();

	constructor(initial: EditorDraft, catalog: EditorCatalog, issues: Issues = {}) {
		this.draft = initial;
		this.catalog = catalog;
		this.issues = issues;
		this.remember(catalog.parts);
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

	/** Parts the page learnt of: picked from a search, or named by an action's answer. */
	remember(parts: readonly { id: number; brand: string; model: string }[]) {
		for (const p of parts) this.#names.set(String(p.id), `${p.brand} ${p.model}`);
	}

	partName(id: string | number): string {
		return this.#names.get(String(id)) ?? '';
	}
}

const KEY = Symbol('guide-draft');
export function setGuideDraft(state: GuideDraftState): GuideDraftState {
	return setContext(KEY, state);
}
export function getGuideDraft(): GuideDraftState {
	return getContext<GuideDraftState>(KEY);
}
