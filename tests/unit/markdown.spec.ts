import { describe, expect, it } from 'vitest';
import type { Element, Root, RootContent } from 'hast';
import rehypeParse from 'rehype-parse';
import { unified } from 'unified';
import { renderMarkdown, sanitiseHtml } from '../../src/lib/server/markdown';

// XSS payloads an author could type into build notes. Sources for the vectors: the OWASP
// XSS Filter Evasion Cheat Sheet and docs/security.md §5 (raw HTML, event handlers,
// javascript:/data: URLs, iframes, svg, style).
const corpus: Record<string, string> = {
	scriptTag: '<script>window.__xss=1</script>',
	scriptInParagraph: 'Hello <script>alert(1)</script> world',
	imgOnerror: '<img src=x onerror="window.__xss=1">',
	svgOnload: '<svg onload="window.__xss=1"><circle r="1"/></svg>',
	svgScript: '<svg><script>window.__xss=1</script></svg>',
	iframe: '<iframe src="javascript:window.__xss=1"></iframe>',
	iframeSrcdoc: '<iframe srcdoc="<script>window.__xss=1</script>"></iframe>',
	styleTag: '<style>body{background:url("javascript:alert(1)")}</style>',
	styleAttr: '<p style="background:url(javascript:alert(1))">x</p>',
	divOnmouseover: '<div onmouseover="window.__xss=1">hover</div>',
	mdJsLink: '[click](javascript:window.__xss=1)',
	mdJsLinkEncoded: '[click](javascript&#58;window.__xss=1)',
	mdJsLinkCase: '[click](JaVaScRiPt:window.__xss=1)',
	mdDataLink: '[click](data:text/html;base64,PHNjcmlwdD53aW5kb3cuX194c3M9MTwvc2NyaXB0Pg==)',
	mdVbscript: '[click](vbscript:msgbox(1))',
	mdImageJs: '![alt](javascript:window.__xss=1)',
	mdImageData: '![alt](data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9YWxlcnQoMSk+)',
	mdImageTitleBreakout: '![a" onerror="window.__xss=1](x.png "t\\" onload=\\"x")',
	mdRefLink: '[x][r]\n\n[r]: javascript:window.__xss=1',
	mdAutolink: '<javascript:window.__xss=1>',
	objectEmbed: '<object data="javascript:alert(1)"></object><embed src="x.swf">',
	formAction: '<form action="javascript:alert(1)"><button>go</button></form>',
	metaRefresh: '<meta http-equiv="refresh" content="0;url=javascript:alert(1)">',
	baseHref: '<base href="javascript:alert(1)//">',
	linkImport: '<link rel="import" href="https://evil.test/x.html">',
	htmlComment: '<!--<script>alert(1)</script>-->',
	mathml: '<math><mtext><table><mglyph><style><img src=x onerror=alert(1)>',
	idClobber: '# Heading {#__proto__}\n\n<a id="location" name="cookie">x</a>',
	tableCell: '| a | b |\n|---|---|\n| <img src=x onerror=alert(1)> | [x](javascript:alert(1)) |'
};

const forbiddenTags = new Set([
	'script',
	'iframe',
	'svg',
	'style',
	'object',
	'embed',
	'form',
	'meta',
	'base',
	'link',
	'math',
	'frame',
	'frameset'
]);
const urlProps = ['href', 'src', 'action', 'formAction', 'poster', 'cite', 'srcSet'];

/** Parses the output as a browser would (hast, no sanitiser) and checks every element. */
function assertInert(html: string) {
	const tree = unified().use(rehypeParse, { fragment: true }).parse(html) as Root;
	const elements: Element[] = [];
	const walk = (nodes: RootContent[]) => {
		for (const n of nodes) {
			if (n.type === 'element') {
				elements.push(n);
				walk(n.children);
			}
		}
	};
	walk(tree.children);
	for (const node of elements) {
		expect(forbiddenTags.has(node.tagName), `<${node.tagName}> survived`).toBe(false);
		for (const [prop, value] of Object.entries(node.properties ?? {})) {
			expect(/^on/i.test(prop), `${prop} on <${node.tagName}>`).toBe(false);
			expect(prop).not.toBe('style');
			if (urlProps.includes(prop)) {
				const url = String(value).trim().toLowerCase();
				expect(url, `${prop}=${url}`).not.toMatch(/^(javascript|data|vbscript):/);
			}
		}
	}
}

describe('renderMarkdown (remark → rehype-sanitize, docs/security.md §5)', () => {
	for (const [name, payload] of Object.entries(corpus)) {
		it(`renders ${name} inert and idempotently`, () => {
			const html = renderMarkdown(payload);
			assertInert(html);
			expect(sanitiseHtml(html)).toBe(html);
		});
	}

	it('keeps ordinary Markdown: headings, lists, GFM tables, task lists, safe links', () => {
		const html = renderMarkdown(
			'## Firmware\n\n1. Enable the memory profile\n2. Update firmware\n\n- [x] fans\n\n| a | b |\n|---|---|\n| 1 | 2 |\n\nSee [help](https://example.test/help) and ~~old~~.'
		);
		expect(html).toContain('<h2>Firmware</h2>');
		expect(html).toContain('<ol>');
		expect(html).toContain('<table>');
		expect(html).toContain('type="checkbox"');
		expect(html).toContain('<a href="https://example.test/help">help</a>');
		expect(html).toContain('<del>old</del>');
		expect(sanitiseHtml(html)).toBe(html);
	});

	it('prefixes ids so author content cannot clobber globals', () => {
		const html = renderMarkdown('<a id="x">raw</a>\n\nText[^1]\n\n[^1]: note');
		expect(html).not.toMatch(/id="x"/);
		expect(html).toMatch(/id="user-content-/);
	});

	it('drops raw HTML but keeps its text as text, never markup', () => {
		const html = renderMarkdown('before <b onclick="x()">bold</b> after');
		expect(html).not.toContain('onclick');
		expect(html).toContain('before');
		expect(html).toContain('after');
	});
});
