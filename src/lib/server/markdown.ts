/**
 * Author Markdown → sanitised HTML, rendered once when a revision is saved and stored
 * beside the Markdown (docs/security.md §5). Pages only ever `{@html}` this output.
 *
 * - remark-rehype runs without `allowDangerousHtml`, so raw HTML in the Markdown is dropped
 *   before it ever becomes a node.
 * - rehype-sanitize with the GitHub schema (`user-content-` clobber prefix, protocol
 *   allowlist that refuses `javascript:`/`data:`/`vbscript:`) must run LAST before stringify,
 *   so no later plugin can reintroduce anything.
 *
 * Every plugin is synchronous, so `processSync` is safe and callers need no `await`.
 * No `$env` or `$app` imports, so seeders run by scripts/ can use it.
 */
import { unified } from 'unified';
import rehypeParse from 'rehype-parse';
import remarkParse from 'remark-parse';
import remarkGfm from 'remark-gfm';
import remarkRehype from 'remark-rehype';
import rehypeSanitize, { defaultSchema } from 'rehype-sanitize';
import rehypeStringify from 'rehype-stringify';

const processor = unified()
	.use(remarkParse)
	.use(remarkGfm)
	.use(remarkRehype, { allowDangerousHtml: false })
	.use(rehypeSanitize, defaultSchema)
	.use(rehypeStringify)
	.freeze();

/** Renders author Markdown to HTML that is safe to inject with `{@html}`. */
export function renderMarkdown(md: string): string {
	return String(processor.processSync(md));
}

// Re-parsing stored HTML (for the idempotence check) goes through the same sanitiser.
const htmlSanitiser = unified()
	.use(rehypeParse, { fragment: true })
	.use(rehypeSanitize, defaultSchema)
	.use(rehypeStringify)
	.freeze();

/** Sanitises already-rendered HTML again; on stored output this must change nothing. */
export function sanitiseHtml(html: string): string {
	return String(htmlSanitiser.processSync(html));
}
