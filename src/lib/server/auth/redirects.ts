// Where a person is sent after signing in or pressing a button that returns them: only a path on
// this site. Browsers drop tabs and newlines inside a URL and read "\" as "/", so "/\t/evil.example"
// or "/\evil.example" would leave the site if passed through as typed.

const PLACEHOLDER_ORIGIN = 'http://kickpanel.invalid';
// C0 controls, DEL and the C1 range; none belongs in a path a person was sent to.
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
const MAX_LENGTH = 2048;
const DECODE_ROUNDS = 3;

function decodedForms(text: string): string[] {
	const forms = [text];
	let current = text;
	for (let i = 0; i < DECODE_ROUNDS; i++) {
		let next: string;
		try {
			next = decodeURIComponent(current);
		} catch {
			break;
		}
		if (next === current) break;
		forms.push(next);
		current = next;
	}
	return forms;
}

function looksOffSite(form: string): boolean {
	return CONTROL.test(form) || form.includes('\\') || !form.startsWith('/') || form.startsWith('//') || /^\/\.+\/\//.test(form);
}

/**
 * The same-site path to go to, or null when `target` could lead anywhere else (another host, a
 * scheme, control characters, backslashes, "//", "/.//", or any of these percent-encoded).
 */
export function sameSitePath(target: string | null | undefined): string | null {
	if (typeof target !== 'string' || target.length === 0 || target.length > MAX_LENGTH) return null;
	if (decodedForms(target).some(looksOffSite)) return null;
	let url: URL;
	try {
		url = new URL(target, PLACEHOLDER_ORIGIN);
	} catch {
		return null;
	}
	if (url.origin !== PLACEHOLDER_ORIGIN) return null;
	const path = `${url.pathname}${url.search}${url.hash}`;
	// The normalised path must not have become protocol-relative ("/a/../.." collapsing to "//host").
	return path.startsWith('//') ? null : path;
}

/** Only same-site paths are followed after sign-in, so a crafted link cannot send someone elsewhere. */
export function safeNext(next: string | null | undefined, fallback = '/'): string {
	return sameSitePath(next) ?? fallback;
}
