/**
 * Who may see a build: the one place that decides it, for the build page, its printable list
 * and CSV, the builds API and content reports (docs/architecture.md Roles; DEVELOPERS.md
 * Builds).
 *
 * - The owner sees everything, hidden or not.
 * - Anyone else sees a public build, or an unlisted one with its link token (`?key=`), unless
 *   the editors have hidden it. They never see the share token, notes, budget or purchases.
 * - Editors and admins also open a build that is hidden or has an open content report,
 *   whatever its visibility (it may have been made private after the report), to decide on
 *   it; they read it as anyone else does.
 * - Everyone else gets "no such build", exactly as for an id that does not exist.
 */
import { createHash, timingSafeEqual } from 'node:crypto';
import { ContentReport } from '$lib/server/db';
import type { Build } from '$lib/server/db';

/** Who is looking: the session's user with their role, or null for a visitor. */
export type Viewer = { id: string; role?: string } | null;

/** 'owner' (everything), 'other' (may read, sees no private data) or null (may not know the build exists). */
export type BuildAccess = 'owner' | 'other' | null;

/** What the decision reads of a build. */
export type AccessFacts = Pick<Build, 'id' | 'ownerId' | 'visibility' | 'shareToken' | 'hiddenAt'>;

/**
 * Whether `given` is the build's share token, in constant time: both sides are reduced to
 * their SHA-256 digests, so the buffers compared are always 32 bytes and neither the time
 * taken nor an early exit tells how many characters matched or how long the token is.
 */
export function shareTokenMatches(stored: string, given: string | null | undefined): boolean {
	if (!given) return false;
	const digest = (text: string) => createHash('sha256').update(text, 'utf8').digest();
	return timingSafeEqual(digest(stored), digest(given));
}

/** Access as a reader has it (owner, public, unlisted with its token): no database needed. */
export function readerAccess(
	build: AccessFacts,
	viewer: Viewer,
	shareToken: string | null | undefined
): BuildAccess {
	if (viewer && viewer.id === build.ownerId) return 'owner';
	// Hidden by the editors (services/content-reports): gone for everyone but the owner and editors.
	if (build.hiddenAt) return null;
	if (build.visibility === 'public') return 'other';
	if (build.visibility === 'unlisted' && shareTokenMatches(build.shareToken, shareToken))
		return 'other';
	return null;
}

/** Access to read a build: as a reader, else as an editor deciding on a hidden or reported build. */
export async function buildAccess(
	build: AccessFacts,
	viewer: Viewer,
	shareToken: string | null | undefined
): Promise<BuildAccess> {
	const asReader = readerAccess(build, viewer, shareToken);
	if (asReader || !viewer || (viewer.role !== 'editor' && viewer.role !== 'admin')) return asReader;
	if (build.hiddenAt) return 'other';
	// The only read of content reports outside services/content-reports: is one still open?
	const open = await ContentReport.count({
		where: { subjectType: 'build', subjectId: String(build.id), state: 'open' }
	});
	return open > 0 ? 'other' : null;
}
