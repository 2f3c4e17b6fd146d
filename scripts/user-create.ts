// npm run user:create -- --email E --password P --role R [--name N]
import { parseArgs } from 'node:util';
import { createUser, newUserSchema, UserError } from '../src/lib/server/services/users';
import { closeDb } from '../src/lib/server/db';

const { values } = parseArgs({
	options: { email: { type: 'string' }, password: { type: 'string' }, role: { type: 'string' }, name: { type: 'string' } }
});
const parsed = newUserSchema.safeParse({ ...values, name: values.name ?? values.email?.split('@')[0] ?? '' });
if (!parsed.success) {
	for (const issue of parsed.error.issues) console.error(`${issue.path.join('.') || 'input'}: ${issue.message}`);
	console.error('usage: npm run user:create -- --email E --password P --role viewer|editor|moderator|admin [--name N]');
	process.exit(2);
}
try {
	const user = await createUser(parsed.data, null);
	console.log(`created ${user.email} (${user.role}), id ${user.id}`);
} catch (err) {
	console.error(err instanceof UserError ? err.message : err);
	process.exitCode = 1;
} finally {
	await closeDb();
}
