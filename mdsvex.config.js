import { fileURLToPath } from 'node:url';
import { escapeSvelte } from 'mdsvex';
import { createHighlighter } from 'shiki';

/*
 * Help pages kept in the repo are written in .svx. Author-written guide text lives in
 * the database and never goes through mdsvex (it is rendered and sanitised on save).
 * The highlighter is created once; shiki's output is escaped so Svelte does not read
 * braces in code samples as expressions.
 */
const THEME = 'github-light';
const LANGS = ['bash', 'json', 'http', 'ts', 'js', 'markdown', 'csv'];

const highlighter = await createHighlighter({ themes: [THEME], langs: LANGS });

/** @type {import('mdsvex').MdsvexOptions} */
const config = {
	extensions: ['.svx'],
	// Svelte 5: layouts receive frontmatter through $props() and render children.
	layoutPropForwarding: 'runes',
	// Absolute: mdsvex emits the path as an import inside each .svx page.
	layout: {
		help: fileURLToPath(new URL('./src/lib/components/help/HelpLayout.svelte', import.meta.url))
	},
	highlight: {
		highlighter: async (code, lang = 'text') => {
			const language = LANGS.includes(lang) ? lang : 'text';
			const html = escapeSvelte(highlighter.codeToHtml(code, { lang: language, theme: THEME }));
			return `{@html \`${html}\` }`;
		}
	}
};

export default config;
