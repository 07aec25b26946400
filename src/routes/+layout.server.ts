import { headerViewer } from '$lib/server/http/header-viewer';
import type { LayoutServerLoad } from './$types';

/** Only what the header needs: the viewer's role and unread notices (http/header-viewer.ts). */
export const load: LayoutServerLoad = async ({ locals }) => ({
	viewer: await headerViewer(locals)
});
