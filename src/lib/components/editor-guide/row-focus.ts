/*
 * Keeping the keyboard focus on a gallery photo's control while the photo moves: a photo that
 * moves or changes stage is drawn again elsewhere (GalleryList), and the browser drops the
 * focus of an element it removes. Rows carry data-gallery-key, their controls data-keep.
 */
export interface RowFocus {
	element: HTMLElement;
	row: string;
	control: string | undefined;
}

/** The focused control, when it is inside a gallery row. */
export function rowFocus(): RowFocus | null {
	const element = document.activeElement;
	if (!(element instanceof HTMLElement)) return null;
	const row = element.closest<HTMLElement>('[data-gallery-key]')?.dataset.galleryKey;
	return row ? { element, row, control: element.dataset.keep } : null;
}

/** After the change is drawn: the same control of the same photo again, else `fallback`. */
export function restoreRowFocus(saved: RowFocus | null, fallback: HTMLElement | undefined) {
	if (!saved || (saved.element.isConnected && document.activeElement === saved.element)) return;
	const again = saved.control
		? document.querySelector<HTMLElement>(
				`[data-gallery-key="${CSS.escape(saved.row)}"] [data-keep="${CSS.escape(saved.control)}"]`
			)
		: null;
	(again ?? fallback)?.focus();
}
