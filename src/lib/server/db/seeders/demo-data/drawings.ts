/*
 * Demo gallery pictures: abstract drawings of our own (a case interior, a cooler, cables),
 * written as SVG here and rasterised by the seed, then sent through the real photo pipeline.
 * They are diagrams, not photographs, and show no product or brand.
 */
export type DrawingKind = 'cooler' | 'psu-cabling' | 'cable-management' | 'part';

const W = 1200;
const H = 900;

function caseShell(): string {
	return `<rect width="${W}" height="${H}" fill="#14181d"/>
	<rect x="60" y="50" width="1080" height="800" rx="18" fill="#1f2933" stroke="#333c46" stroke-width="6"/>
	<rect x="140" y="110" width="620" height="520" rx="8" fill="#27323d" stroke="#3f4c59" stroke-width="4"/>
	<g fill="#3f4c59">${[0, 1, 2, 3].map((i) => `<rect x="${560 + i * 0}" y="${380 + i * 60}" width="170" height="14" rx="3"/>`).join('')}</g>`;
}

function cooler(): string {
	return `<rect x="330" y="190" width="230" height="230" rx="10" fill="#5b6672"/>
	<circle cx="445" cy="305" r="100" fill="#2f3a45" stroke="#a2acb7" stroke-width="6"/>
	<g stroke="#a2acb7" stroke-width="10" stroke-linecap="round">
		<path d="M445 305 L445 220"/><path d="M445 305 L520 345"/><path d="M445 305 L370 345"/>
	</g>
	<circle cx="445" cy="305" r="22" fill="#e48a5f"/>
	<g fill="#e4ded4">${[0, 1, 2, 3].map((i) => `<rect x="${250 + i * 8}" y="160" width="4" height="290"/>`).join('')}</g>`;
}

function psu(): string {
	return `<rect x="140" y="680" width="360" height="140" rx="8" fill="#333c46" stroke="#5b6672" stroke-width="4"/>
	<circle cx="320" cy="750" r="50" fill="#1b2128" stroke="#5b6672" stroke-width="4"/>
	<rect x="820" y="680" width="260" height="140" rx="8" fill="#27323d"/>`;
}

function cables(tidy: boolean): string {
	const paths = tidy
		? [
				'M460 690 C 520 640, 780 640, 800 560 L 800 300',
				'M420 690 C 480 620, 760 600, 780 520 L 780 260',
				'M380 690 C 420 560, 120 520, 120 300 L 180 160'
			]
		: [
				'M460 690 C 700 500, 300 450, 800 300',
				'M420 690 C 250 400, 900 600, 700 200',
				'M380 690 C 600 800, 100 300, 300 150'
			];
	const colours = ['#e48a5f', '#5ec2ba', '#f0c45c'];
	const ties = tidy
		? [300, 380, 460]
				.map((y) => `<rect x="770" y="${y}" width="40" height="10" rx="3" fill="#e8e3da"/>`)
				.join('')
		: '';
	return (
		paths
			.map(
				(d, i) =>
					`<path d="${d}" fill="none" stroke="${colours[i]}" stroke-width="16" stroke-linecap="round"/>`
			)
			.join('') + ties
	);
}

function partSketch(hue: string): string {
	return `<rect width="${W}" height="${H}" fill="#fbf8f3"/>
	<rect x="250" y="200" width="700" height="500" rx="24" fill="${hue}"/>
	<rect x="330" y="280" width="540" height="340" rx="12" fill="#ffffff" opacity="0.25"/>
	<g fill="#1f2933">${[0, 1, 2, 3, 4, 5].map((i) => `<rect x="${340 + i * 90}" y="720" width="40" height="40" rx="4"/>`).join('')}</g>`;
}

/** The SVG source of one demo drawing. */
export function drawingSvg(kind: DrawingKind, hue = '#0e6f6a'): string {
	const body =
		kind === 'part'
			? partSketch(hue)
			: caseShell() +
				(kind === 'cooler' ? cooler() : '') +
				psu() +
				(kind === 'cooler' ? '' : cables(kind === 'cable-management'));
	return `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">${body}</svg>`;
}
