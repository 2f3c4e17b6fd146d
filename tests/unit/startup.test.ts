import { execFileSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

// npm start decides in scripts/lib.sh whether to load the sample shop, whose people have published passwords.
function sampleDataChoice(host: string, asked?: string): string {
	const script = 'source scripts/lib.sh; sample_data_choice "$1" "$2"';
	return execFileSync('bash', ['-c', script, 'choice', host, asked ?? ''], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] }).trim();
}

describe('sample people on npm start', () => {
	it('are offered on a loopback address unless SAMPLE_DATA=0', () => {
		for (const host of ['127.0.0.1', '127.0.1.1', 'localhost', '::1']) {
			expect(sampleDataChoice(host), host).toBe('1');
			expect(sampleDataChoice(host, '1'), host).toBe('1');
			expect(sampleDataChoice(host, '0'), host).toBe('0');
		}
	});

	it('are never loaded on an address other machines can reach, even when asked for', () => {
		for (const host of ['0.0.0.0', '::', '192.168.1.20', 'kickpanel.example', '127.0.0.1.example', 'localhost.example', '']) {
			expect(sampleDataChoice(host), host).toBe('0');
			expect(sampleDataChoice(host, '1'), host).toBe('0');
		}
	});
});
