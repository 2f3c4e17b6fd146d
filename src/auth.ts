import { randomUUID } from 'node:crypto';
import { SvelteKitAuth, CredentialsSignin } from '@auth/sveltekit';
import { getRequestEvent } from '$app/server';
import Credentials from '@auth/sveltekit/providers/credentials';
import { authSecret, config } from '$lib/server/config';
import { authenticate } from '$lib/server/services/users';
import { SESSION_MAX_AGE_SECONDS } from '$lib/server/auth/session';

class WrongCredentials extends CredentialsSignin {
	code = 'credentials';
}
class TooManyAttempts extends CredentialsSignin {
	code = 'locked';
}

/** Where Auth.js answers its own requests (sign-in callbacks, sign-out, its CSRF token). */
export const AUTH_BASE_PATH = '/auth';

// One settings object for every request: Auth.js rebuilds a settings function's answer on each one.
export const { handle: authHandle, signIn, signOut } = SvelteKitAuth({
	trustHost: config.auth.trustHost,
	// Read when a request needs it, so a missing secret is reported by start-up checks, not on import.
	get secret() {
		return authSecret();
	},
	basePath: AUTH_BASE_PATH,
	session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_SECONDS },
	pages: { signIn: '/signin', error: '/signin' },
	logger: { error: () => {}, warn: () => {} },
	providers: [
		Credentials({
			id: 'credentials',
			name: 'E-mail and password',
			credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
			async authorize(credentials) {
				// The sign-in throttle counts attempts by the address they come from.
				const result = await authenticate(credentials.email, credentials.password, getRequestEvent().getClientAddress());
				if (!result.ok) throw result.reason === 'locked' ? new TooManyAttempts() : new WrongCredentials();
				return { id: String(result.user.id), email: result.user.email, name: result.user.name, sessionVersion: result.user.sessionVersion };
			}
		})
	],
	callbacks: {
		jwt({ token, user }) {
			if (user) {
				token.uid = Number(user.id);
				token.sv = (user as { sessionVersion?: number }).sessionVersion ?? 1;
				// Each sign-in gets its own id, so signing out can end this session and no other.
				token.sid = randomUUID();
			}
			return token;
		}
	}
});
