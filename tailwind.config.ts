import typography from '@tailwindcss/typography';
import type { Config } from 'tailwindcss';

/*
 * The single source of Slotwise's design tokens (see LOOK.md).
 *
 * Hex values live only in the two palettes below. They are emitted as CSS custom
 * properties so one set of class names (`bg-paper`, `text-muted`, ...) follows the
 * reader's colour scheme through `prefers-color-scheme` without a `dark:` variant on
 * every element. Every text/background pair used by the UI was checked for
 * WCAG 2.2 AA (4.5:1) in both schemes; `rule` is a decorative hairline only.
 */
const light = {
	paper: '#FBF8F3',
	surface: '#FFFFFF',
	ink: '#1F2933',
	muted: '#5B6672',
	rule: '#E4DED4',
	teal: '#0E6F6A',
	copper: '#B4532A',
	/** Text on a copper or teal fill: white on the light scheme's dark accents (5.0:1 on copper). */
	'on-accent': '#FFFFFF',
	'amber-ink': '#8A5A00',
	'amber-bg': '#FFF4DA',
	'brick-ink': '#A4262C',
	'brick-bg': '#FDECEC',
	/** The veil behind a modal (used at 80 %): dark in both schemes, so the dialog stands out. */
	scrim: '#1F2933'
} as const;

type Palette = Record<keyof typeof light, string>;

// Lighter accents on a warm near-black keep the same contrast ratios as the light scheme.
const dark: Palette = {
	paper: '#14181D',
	surface: '#1B2128',
	ink: '#E8E3DA',
	muted: '#A2ACB7',
	rule: '#333C46',
	teal: '#5EC2BA',
	copper: '#E48A5F',
	// The dark scheme's accents are light, so text on them is dark (6.8:1 on copper).
	'on-accent': '#14181D',
	'amber-ink': '#F0C45C',
	'amber-bg': '#3A2D0C',
	'brick-ink': '#F5A3A6',
	'brick-bg': '#3F1C1F',
	// Darker than paper: the page behind a modal recedes rather than turning grey.
	scrim: '#07090B'
};

const cssVars = (palette: Palette) =>
	Object.fromEntries(Object.entries(palette).map(([name, hex]) => [`--sw-${name}`, hex]));

const v = (name: keyof Palette) => `var(--sw-${name})`;

const px = (n: number) => `${n / 16}rem`;

export default {
	content: ['./src/**/*.{html,js,ts,svelte,svx,md}'],
	theme: {
		// Replaced, not extended: only our tokens exist, so off-palette colours cannot creep in.
		colors: {
			transparent: 'transparent',
			current: 'currentColor',
			inherit: 'inherit',
			paper: v('paper'),
			surface: v('surface'),
			ink: v('ink'),
			muted: v('muted'),
			rule: v('rule'),
			teal: v('teal'),
			copper: v('copper'),
			'on-accent': v('on-accent'),
			amber: { ink: v('amber-ink'), bg: v('amber-bg') },
			brick: { ink: v('brick-ink'), bg: v('brick-bg') },
			scrim: v('scrim'),
			// Severity aliases, so fit-report code reads in the product's words.
			ok: v('teal'),
			caution: { ink: v('amber-ink'), bg: v('amber-bg') },
			conflict: { ink: v('brick-ink'), bg: v('brick-bg') }
		},
		fontFamily: {
			sans: ['Inter', 'ui-sans-serif', 'system-ui', 'sans-serif'],
			serif: ['Merriweather', 'ui-serif', 'Georgia', 'serif'],
			mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'Consolas', 'monospace']
		},
		// The whole type scale: 14 / 16 / 18 / 22 / 28 / 36 px.
		fontSize: {
			sm: [px(14), { lineHeight: px(20) }],
			base: [px(16), { lineHeight: px(24) }],
			lg: [px(18), { lineHeight: px(28) }],
			xl: [px(22), { lineHeight: px(30) }],
			'2xl': [px(28), { lineHeight: px(36) }],
			'3xl': [px(36), { lineHeight: px(44) }]
		},
		borderRadius: {
			none: '0',
			DEFAULT: '6px',
			full: '9999px'
		},
		extend: {
			typography: {
				DEFAULT: {
					css: {
						'--tw-prose-body': v('ink'),
						'--tw-prose-headings': v('ink'),
						'--tw-prose-lead': v('muted'),
						'--tw-prose-links': v('teal'),
						'--tw-prose-bold': v('ink'),
						'--tw-prose-counters': v('muted'),
						'--tw-prose-bullets': v('muted'),
						'--tw-prose-hr': v('rule'),
						'--tw-prose-quotes': v('ink'),
						'--tw-prose-quote-borders': v('rule'),
						'--tw-prose-captions': v('muted'),
						'--tw-prose-kbd': v('ink'),
						'--tw-prose-kbd-shadows': v('rule'),
						'--tw-prose-code': v('ink'),
						'--tw-prose-pre-code': v('ink'),
						'--tw-prose-pre-bg': v('surface'),
						'--tw-prose-th-borders': v('rule'),
						'--tw-prose-td-borders': v('rule'),
						// About 70 characters of Merriweather per line.
						maxWidth: '70ch',
						fontFamily: 'Merriweather, ui-serif, Georgia, serif',
						lineHeight: '1.8',
						a: { textUnderlineOffset: '3px', fontWeight: '400' },
						'a:hover': { textDecorationThickness: '2px' },
						// Headings are interface type; reading text stays in Merriweather.
						'h1, h2, h3, h4': {
							fontFamily: 'Inter, ui-sans-serif, system-ui, sans-serif',
							fontWeight: '600',
							letterSpacing: '-0.01em'
						},
						h1: { fontSize: px(36), lineHeight: px(44) },
						h2: { fontSize: px(22), lineHeight: px(30) },
						h3: { fontSize: px(18), lineHeight: px(28) },
						'code::before': { content: 'none' },
						'code::after': { content: 'none' },
						code: {
							fontWeight: '400',
							backgroundColor: v('surface'),
							border: `1px solid ${v('rule')}`,
							borderRadius: '6px',
							padding: '0.1em 0.3em'
						},
						// Highlighted blocks carry their own colours; we add the hairline frame.
						pre: {
							border: `1px solid ${v('rule')}`,
							borderRadius: '6px',
							fontSize: px(14),
							lineHeight: '1.6'
						},
						'pre code': { border: '0', padding: '0', backgroundColor: 'transparent' }
					}
				}
			}
		}
	},
	plugins: [
		typography,
		{
			handler: ({ addBase }) => {
				addBase({
					':root': { ...cssVars(light), colorScheme: 'light dark' },
					'@media (prefers-color-scheme: dark)': { ':root': cssVars(dark) }
				});
			}
		}
	]
} satisfies Config;
