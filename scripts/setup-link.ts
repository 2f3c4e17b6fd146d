// npm start on an install without an admin prints a one-time link that makes the first one.
import { closeDb } from '../src/lib/server/db';
import { issueSetupLink } from '../src/lib/server/services/setup';

try {
	const issued = await issueSetupLink();
	if (issued) {
		console.log(`
  This Kickpanel has no admin yet. Open this link within the hour to make the first one:
    ${issued.link}
  It works once. Or run: npm run user:create -- --email you@example.com --password '…' --role admin
`);
	}
} finally {
	await closeDb();
}
