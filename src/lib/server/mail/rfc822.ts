// Reads just enough of an Internet message (RFC 5322 headers, RFC 2045–2047 MIME) to show it in the outbox.

export type ReadMessage = {
	subject: string;
	from: string;
	to: string;
	date: string | null;
	text: string;
	html: string;
};

type Part = { headers: Map<string, string>; body: string };

function splitHeaders(raw: string): Part {
	const cut = raw.search(/\r?\n\r?\n/);
	const head = cut === -1 ? raw : raw.slice(0, cut);
	const body = cut === -1 ? '' : raw.slice(cut).replace(/^\r?\n\r?\n/, '');
	const headers = new Map<string, string>();
	for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
		const colon = line.indexOf(':');
		if (colon <= 0) continue;
		const name = line.slice(0, colon).trim().toLowerCase();
		if (!headers.has(name)) headers.set(name, line.slice(colon + 1).trim());
	}
	return { headers, body };
}

function decodeBytes(bytes: Uint8Array, charset: string): string {
	try {
		return new TextDecoder(charset || 'utf-8').decode(bytes);
	} catch {
		return new TextDecoder('utf-8').decode(bytes);
	}
}

function quotedPrintableBytes(input: string, underscoreIsSpace: boolean): Uint8Array {
	const text = input.replace(/=\r?\n/g, '');
	const out: number[] = [];
	for (let i = 0; i < text.length; i++) {
		const ch = text[i];
		if (ch === '=' && /^[0-9A-Fa-f]{2}$/.test(text.slice(i + 1, i + 3))) {
			out.push(parseInt(text.slice(i + 1, i + 3), 16));
			i += 2;
		} else if (ch === '_' && underscoreIsSpace) {
			out.push(0x20);
		} else {
			for (const b of Buffer.from(ch, 'utf8')) out.push(b);
		}
	}
	return Uint8Array.from(out);
}

/** RFC 2047 encoded words, e.g. =?UTF-8?Q?caf=C3=A9?=; whitespace between two encoded words is dropped. */
export function decodeWords(value: string): string {
	return value
		.replace(/(=\?[^?]+\?[BbQq]\?[^?]*\?=)\s+(?==\?)/g, '$1')
		.replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_, charset: string, encoding: string, data: string) => {
			const bytes = encoding.toUpperCase() === 'B' ? Buffer.from(data, 'base64') : quotedPrintableBytes(data, true);
			return decodeBytes(bytes, charset.split('*')[0]);
		});
}

function headerParams(value: string): { value: string; params: Record<string, string> } {
	const [first, ...rest] = value.split(';');
	const params: Record<string, string> = {};
	for (const piece of rest) {
		const eq = piece.indexOf('=');
		if (eq === -1) continue;
		params[piece.slice(0, eq).trim().toLowerCase()] = piece.slice(eq + 1).trim().replace(/^"(.*)"$/, '$1');
	}
	return { value: first.trim().toLowerCase(), params };
}

function decodeBody(part: Part, charset: string): string {
	const encoding = (part.headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
	if (encoding === 'base64') return decodeBytes(Buffer.from(part.body.replace(/\s+/g, ''), 'base64'), charset);
	if (encoding === 'quoted-printable') return decodeBytes(quotedPrintableBytes(part.body, false), charset);
	return part.body;
}

function collect(part: Part, found: { text: string; html: string }, depth = 0): void {
	const type = headerParams(part.headers.get('content-type') ?? 'text/plain');
	const disposition = headerParams(part.headers.get('content-disposition') ?? 'inline').value;
	if (type.value.startsWith('multipart/') && type.params.boundary && depth < 8) {
		const marker = `--${type.params.boundary}`;
		const sections = part.body.split(new RegExp(`\\r?\\n?${marker.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`));
		for (const section of sections.slice(1)) {
			if (section.startsWith('--')) break;
			collect(splitHeaders(section.replace(/^[ \t]*\r?\n/, '')), found, depth + 1);
		}
		return;
	}
	if (disposition === 'attachment') return;
	const charset = type.params.charset ?? 'utf-8';
	if (type.value === 'text/plain' && !found.text) found.text = decodeBody(part, charset);
	if (type.value === 'text/html' && !found.html) found.html = decodeBody(part, charset);
}

export function readMessage(raw: string): ReadMessage {
	const top = splitHeaders(raw);
	const found = { text: '', html: '' };
	collect(top, found);
	const header = (name: string) => decodeWords(top.headers.get(name) ?? '');
	return {
		subject: header('subject'),
		from: header('from'),
		to: header('to'),
		date: top.headers.get('date') ?? null,
		text: found.text.replace(/\r\n/g, '\n').trimEnd(),
		html: found.html
	};
}
