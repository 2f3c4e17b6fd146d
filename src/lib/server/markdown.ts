import MarkdownIt from 'markdown-it';
import sanitizeHtml from 'sanitize-html';
import { RENDITIONS } from './storage/renditions';

// Notes are written by staff but read by everyone, so the HTML is built with raw
// HTML off and then filtered again: two independent gates.

const markdown = new MarkdownIt({ html: false, linkify: true, typographer: true });

// Images come only from this app's own photo store (ids are the content's sha256), so a page never makes a
// reader's browser fetch from another host. Any other image is written as its alt text.
const OWN_PHOTO = new RegExp(`^/photos/[0-9a-f]{64}/(?:${RENDITIONS.join('|')})$`);
export const isOwnPhotoPath = (src: string): boolean => OWN_PHOTO.test(src);

const renderImage = markdown.renderer.rules.image!;
markdown.renderer.rules.image = (tokens, idx, options, env, self) => {
	if (isOwnPhotoPath(String(tokens[idx].attrGet('src') ?? ''))) return renderImage(tokens, idx, options, env, self);
	return markdown.utils.escapeHtml(self.renderInlineAsText(tokens[idx].children ?? [], options, env));
};

const SANITIZE: sanitizeHtml.IOptions = {
	allowedTags: [
		'p', 'br', 'hr', 'h1', 'h2', 'h3', 'h4', 'h5', 'h6',
		'strong', 'em', 's', 'del', 'code', 'pre', 'blockquote',
		'ul', 'ol', 'li', 'a', 'img',
		'table', 'thead', 'tbody', 'tr', 'th', 'td'
	],
	allowedAttributes: {
		a: ['href', 'rel'],
		img: ['src', 'alt'],
		ol: ['start'],
		th: ['style'],
		td: ['style'],
		code: ['class']
	},
	allowedClasses: { code: [/^language-[A-Za-z0-9_-]+$/] },
	// Table column alignment is the only style Markdown produces.
	allowedStyles: {
		th: { 'text-align': [/^(left|right|center)$/] },
		td: { 'text-align': [/^(left|right|center)$/] }
	},
	allowedSchemes: ['http', 'https', 'mailto'],
	allowedSchemesByTag: { img: [] },
	allowedSchemesAppliedToAttributes: ['href', 'src', 'cite'],
	allowProtocolRelative: false,
	disallowedTagsMode: 'discard',
	exclusiveFilter: (frame) => frame.tag === 'img' && !isOwnPhotoPath(frame.attribs.src ?? ''),
	transformTags: {
		a: sanitizeHtml.simpleTransform('a', { rel: 'noopener nofollow' })
	},
	// Text stays text; also write the colon and equals sign of "javascript:" and
	// "onclick=" as entities so the markup never carries those strings, even escaped.
	textFilter: (text) => text.replace(/(javascript):/gi, '$1&#58;').replace(/\b(on[a-z]+)(\s*)=/gi, '$1$2&#61;')
};

/** Markdown notes to HTML that is safe to put on a page. */
export function renderMarkdown(md: string): string {
	return sanitizeHtml(markdown.render(md), SANITIZE);
}
