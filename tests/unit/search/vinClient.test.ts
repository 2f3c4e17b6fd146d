import { readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { decodeVin } from '../../../src/lib/server/vin/client';
import { readConfig } from '../../../src/lib/server/config';
import { FAKE_CATALOGUE, fakeDecode, startVinDecoderFake } from '../../../src/lib/server/vin/fake';
import { localServices } from '../../../src/lib/server/local-services';
import { vinDecoderFake } from '../../../src/lib/server/vin/fake';
import { checkDigit, modelYear } from '../../../src/lib/domain/vin';
import { vinPatternMatches } from '../../../src/lib/domain/search/vinPattern';

/** An invented VIN starting with `start`, model-year code `year` (position 10), with its own check digit. */
function sampleVin(start: string, year = 'C'): string {
	const body = (start + 'A7B8C9D0E1F2G3H4J').slice(0, 17).split('');
	body[6] = body[6].replace(/[0-9]/, 'A'); // a letter at position 7: the 2010–2039 cycle
	body[9] = year;
	body[8] = '0';
	body[8] = checkDigit(body.join(''));
	return body.join('');
}

let fake: Awaited<ReturnType<typeof startVinDecoderFake>>;
let silent: Server;
let silentUrl: string;
let odd: Server;
let oddUrl: string;

const listen = (server: Server) =>
	new Promise<string>((resolve) => server.listen(0, '127.0.0.1', () => resolve(`http://127.0.0.1:${(server.address() as AddressInfo).port}`)));

beforeAll(async () => {
	fake = await startVinDecoderFake(0);
	silent = createServer(() => {}); // accepts and never answers
	silentUrl = await listen(silent);
	odd = createServer((req, res) => {
		if (req.url?.includes('VD1TN')) {
			res.writeHead(200, { 'content-type': 'application/json' });
			res.end('{"vin": 12}');
		} else if (req.url?.includes('KV7BR')) {
			res.writeHead(200, { 'content-type': 'text/html' });
			res.end('<html>maintenance</html>');
		} else {
			res.writeHead(502);
			res.end();
		}
	});
	oddUrl = await listen(odd);
});

afterAll(async () => {
	await fake.stop();
	silent.closeAllConnections();
	await new Promise((r) => silent.close(r));
	await new Promise((r) => odd.close(r));
});

describe('the local VIN decoder fake', () => {
	it('is registered with the local stand-ins', () => {
		expect(localServices).toContain(vinDecoderFake);
	});

	it('decodes an invented VIN to its sample make and model, with the model year from position 10', () => {
		const vin = sampleVin('VD1TN');
		expect(fakeDecode(vin)).toEqual({ vin, vehicles: [{ make: 'Veldra', model: 'Tarn', modelYear: 2012, body: 'sedan' }] });
	});

	it('answers an empty list for a VIN it does not know', () => {
		expect(fakeDecode(sampleVin('ZZ9ZZ')).vehicles).toEqual([]);
	});

	it('agrees with the VIN patterns recorded on the sample pages', () => {
		const samples = JSON.parse(readFileSync(new URL('../../../content-seed/vehicles.json', import.meta.url), 'utf8')).vehicles;
		let checked = 0;
		for (const { identity } of samples) {
			for (const pattern of identity.vinPatterns as string[]) {
				const vin = sampleVin(pattern.replace(/\*.*$/, ''));
				expect(vinPatternMatches(pattern, vin)).toBe(true);
				expect(fakeDecode(vin).vehicles[0], pattern).toMatchObject({ make: identity.make, model: identity.model });
				checked++;
			}
		}
		expect(checked).toBeGreaterThan(10);
	});

	it('uses no letter a VIN may not hold', () => {
		// 49 CFR 565: I, O and Q never appear in a VIN
		for (const e of FAKE_CATALOGUE) expect(e.prefix).not.toMatch(/[IOQ]/);
	});
});

describe('decodeVin', () => {
	it('reads the service answer', async () => {
		const vin = sampleVin('KV7PN', 'E');
		expect(await decodeVin(vin, { url: fake.url })).toEqual({
			status: 'found',
			vehicle: { make: 'Korvane', model: 'Pennick', modelYear: modelYear(vin), body: 'pickup' }
		});
	});

	it('reports an unknown VIN', async () => {
		expect(await decodeVin(sampleVin('ZZ9ZZ'), { url: fake.url })).toEqual({ status: 'unknown' });
	});

	it('degrades to unavailable when nothing listens', async () => {
		const closed = await startVinDecoderFake(0);
		await closed.stop();
		expect(await decodeVin(sampleVin('VD1TN'), { url: closed.url })).toEqual({ status: 'unavailable', reason: 'the service could not be reached' });
	});

	it('gives up after the timeout', async () => {
		const started = Date.now();
		expect(await decodeVin(sampleVin('VD1TN'), { url: silentUrl, timeoutMs: 200 })).toEqual({ status: 'unavailable', reason: 'no answer within 0.2 s' });
		expect(Date.now() - started).toBeLessThan(2_000);
	});

	it('treats an error status, HTML or an unexpected shape as unavailable', async () => {
		expect(await decodeVin(sampleVin('HV8ST'), { url: oddUrl })).toEqual({ status: 'unavailable', reason: 'the service answered 502' });
		expect(await decodeVin(sampleVin('KV7BR'), { url: oddUrl })).toEqual({ status: 'unavailable', reason: 'the service sent an answer that is not JSON' });
		expect(await decodeVin(sampleVin('VD1TN'), { url: oddUrl })).toEqual({ status: 'unavailable', reason: 'the service sent an answer in an unexpected shape' });
	});

	it('takes its address from VIN_DECODE_URL, defaulting to the local fake', () => {
		expect(readConfig({}).vin.url).toBe('http://127.0.0.1:3391');
		expect(readConfig({ VIN_DECODE_URL: 'https://decoder.example.test/', VIN_DECODE_TIMEOUT_MS: '750' }).vin).toMatchObject({
			url: 'https://decoder.example.test',
			timeoutMs: 750,
			apiKey: null
		});
	});
});
