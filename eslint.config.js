// Flat config: JavaScript and TypeScript recommended rules, Svelte's, then Prettier's
// (formatting is Prettier's job, so ESLint keeps out of it).
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

export default ts.config(
	{
		ignores: [
			'build/',
			'.svelte-kit/',
			'.data/',
			'.reports/',
			'node_modules/',
			'static/',
			'test-results/'
		]
	},
	js.configs.recommended,
	...ts.configs.recommended,
	...svelte.configs.recommended,
	prettier,
	...svelte.configs.prettier,
	{
		languageOptions: { globals: { ...globals.browser, ...globals.node } },
		rules: {
			// Types carry the contract; `any` and `!` hide where it breaks.
			'@typescript-eslint/no-explicit-any': 'error',
			'@typescript-eslint/no-non-null-assertion': 'error',
			'@typescript-eslint/no-unused-vars': [
				'error',
				{ argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' }
			],
			// TypeScript already checks names; this rule misreads type-only globals.
			'no-undef': 'off',
			// No base path: links are plain paths built by typed helpers ($lib/paged-href and the like).
			'svelte/no-navigation-without-resolve': 'off',
			// `{' '}` keeps a space that Svelte would trim at the edge of an {#if} block.
			'svelte/no-useless-mustaches': 'off',
			// Flags plain URLSearchParams built inside functions to make an href: not state.
			'svelte/prefer-svelte-reactivity': 'off'
		}
	},
	{
		// A missing value fails the assertion that reads it; `!` keeps test setup short.
		files: ['tests/**', 'bench/**'],
		rules: { '@typescript-eslint/no-non-null-assertion': 'off' }
	},
	{
		files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
		languageOptions: {
			parserOptions: {
				projectService: true,
				extraFileExtensions: ['.svelte'],
				parser: ts.parser,
				svelteConfig
			}
		}
	},
	{
		// The domain is pure: no framework, database or environment.
		files: ['src/lib/domain/**'],
		rules: {
			'no-restricted-imports': [
				'error',
				{
					patterns: [
						{
							group: ['svelte', 'svelte/*', '@sveltejs/*', '$app/*', '$env/*'],
							message: 'The domain imports no framework code.'
						},
						{
							group: ['sequelize', 'mariadb', '$lib/server/*'],
							message: 'The domain imports no database code.'
						}
					]
				}
			]
		}
	}
);
