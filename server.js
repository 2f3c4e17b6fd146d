// The production server: the built app behind response compression, with kept pages answered first.
// `node server.js` after `vite build`; HOST, PORT and SHUTDOWN_TIMEOUT as for the adapter's own entry.
import http from 'node:http';
import zlib from 'node:zlib';
import compression from 'compression';
import { handler } from './build/handler.js';

const host = process.env.HOST || '0.0.0.0';
const port = Number(process.env.PORT || 3000);
const shutdownSeconds = Number(process.env.SHUTDOWN_TIMEOUT || 30);

// Pages, JSON, scripts and styles shrink to a fraction; photos are compressed already. A live event
// stream would sit in the compressor's buffer, so it goes out as it is. Every write is flushed, so a
// page streamed in parts still reaches the browser part by part.
const compress = compression({
	threshold: 1024,
	flush: zlib.constants.Z_SYNC_FLUSH,
	brotli: { flush: zlib.constants.BROTLI_OPERATION_FLUSH },
	filter: (req, res) => !String(res.getHeader('content-type') ?? '').startsWith('text/event-stream') && compression.filter(req, res)
});

function serve(req, res) {
	compress(req, res, (err) => {
		if (err) {
			res.statusCode = 500;
			res.end('The server could not answer this request.');
			return;
		}
		handler(req, res, () => {
			res.statusCode = 404;
			res.end('Not found');
		});
	});
}

// Repeat views of kept pages are answered before SvelteKit once the app has opened that door
// (src/lib/server/render/keptPages.ts); it answers null for everything else, which SvelteKit serves.
const KEPT_PAGES = Symbol.for('kickpanel.keptPages');

const server = http.createServer((req, res) => {
	const keptPages = req.method === 'GET' ? globalThis[KEPT_PAGES] : undefined;
	if (!keptPages) return serve(req, res);
	keptPages(req).then(
		(answer) => {
			if (!answer) return serve(req, res);
			res.writeHead(answer.status, answer.headers.flat());
			res.end(answer.body ?? undefined);
		},
		() => serve(req, res)
	);
});

server.listen({ host, port }, () => console.log(`Listening on http://${host}:${port}`));

let closing = false;
function shutDown(reason) {
	if (closing) return;
	closing = true;
	server.closeIdleConnections();
	server.close(() => process.emit('sveltekit:shutdown', reason));
	setTimeout(() => server.closeAllConnections(), shutdownSeconds * 1000).unref();
}
process.on('SIGTERM', shutDown);
process.on('SIGINT', shutDown);
