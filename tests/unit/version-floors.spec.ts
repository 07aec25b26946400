import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import semver from 'semver';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';

/*
 * docs/security.md §0 (ASVS 15.2.1): the versions locked in package-lock.json must be
 * at or above the floors that carry fixes for known advisories. Each floor names why.
 */
const FLOORS: Record<string, { floor: string; why: string }> = {
	'@sveltejs/kit': {
		floor: '2.70.0',
		why: 'CSRF off in non-production builds before 2.70.0; CVE-2026-40073; CVE-2025-67647'
	},
	svelte: { floor: '5.53.5', why: 'CVE-2026-27901 SSR XSS' },
	'@auth/sveltekit': { floor: '1.11.3', why: 'GHSA-7rqj-j65f-68wh, GHSA-xmf8-cvqr-rfgj' },
	'@auth/core': { floor: '0.41.3', why: 'GHSA-7rqj-j65f-68wh' },
	sequelize: { floor: '6.37.8', why: 'CVE-2026-30951 JSON-key SQL injection; CVE-2023-25813' },
	nodemailer: {
		floor: '10.4.1',
		why: 'fixes land only on the latest major; GHSA-3q53-mvfw-q9v8 (10.4.1)'
	},
	sharp: { floor: '0.35.0', why: 'GHSA-f88m-g3jw-g9cj, libvips CVEs in the bundled binaries' }
};

/** The advisory's fix is libvips 8.18.3, which sharp 0.35.0 bundles. */
const LIBVIPS_FLOOR = '8.18.3';

const lock = JSON.parse(
	readFileSync(resolve(import.meta.dirname, '../../package-lock.json'), 'utf8')
) as {
	packages: Record<string, { version?: string }>;
};

/** Every copy of a package in the lockfile (hoisted and nested). */
function lockedVersions(name: string): string[] {
	return Object.entries(lock.packages)
		.filter(([path]) => path === `node_modules/${name}` || path.endsWith(`/node_modules/${name}`))
		.map(([, entry]) => entry.version ?? '0.0.0');
}

describe('dependency version floors (docs/security.md §0)', () => {
	for (const [name, { floor, why }] of Object.entries(FLOORS)) {
		it(`${name} ≥ ${floor} (${why})`, () => {
			const versions = lockedVersions(name);
			expect(versions.length, `${name} is in the lockfile`).toBeGreaterThan(0);
			for (const v of versions) expect(semver.gte(v, floor), `${name}@${v}`).toBe(true);
		});
	}

	it(`the libvips sharp loads is ≥ ${LIBVIPS_FLOOR} (GHSA-f88m-g3jw-g9cj), whichever binary it found`, () => {
		const vips = sharp.versions.vips;
		expect(semver.valid(vips), `libvips ${vips}`).not.toBeNull();
		expect(semver.gte(vips, LIBVIPS_FLOOR), `libvips ${vips}`).toBe(true);
	});
});
