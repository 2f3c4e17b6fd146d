// Every e-mail Kickpanel sends, as plain text and as simple HTML saying the same thing.
import { formatWhen } from '../../domain/shopTime';

export type MailBody = { subject: string; text: string; html: string };

const ROLE_WORDS: Record<string, string> = {
	viewer: 'look up vehicle pages',
	editor: 'look up and edit vehicle pages',
	moderator: 'edit vehicle pages and sign off changes',
	admin: 'edit, sign off changes and manage staff accounts'
};

function escapeHtml(s: string): string {
	return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** Times in a mail read in the shop's zone, with its short name. */
const at = (d: Date, zone?: string): string => formatWhen(d, zone);

function page(title: string, inner: string, footer: string): string {
	return `<!doctype html><html><head><meta charset="utf-8"><title>${escapeHtml(title)}</title></head>
<body style="margin:0;background:#f7f6f4;font-family:system-ui,sans-serif;color:#1c1a17">
<div style="max-width:560px;margin:0 auto;padding:24px">
<p style="margin:0 0 16px;font-weight:700;color:#964d20">Kickpanel</p>
${inner}
<p style="margin-top:32px;font-size:13px;color:#6d665b">${footer}</p>
</div></body></html>`;
}

function button(href: string, label: string): string {
	return `<p><a href="${escapeHtml(href)}" style="display:inline-block;background:#964d20;color:#fff;padding:12px 20px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(label)}</a></p>
<p style="font-size:13px;color:#544e45">Or paste this address into your browser:<br><span style="word-break:break-all">${escapeHtml(href)}</span></p>`;
}

export function inviteMail(input: { shopName: string; inviterName: string; role: string; link: string; expiresAt: Date; timeZone?: string }): MailBody {
	const can = ROLE_WORDS[input.role] ?? 'use the shop wiki';
	const subject = `${input.inviterName} set up a Kickpanel account for you at ${input.shopName}`;
	const text = [
		`Hello,`,
		``,
		`${input.inviterName} has invited you to ${input.shopName}'s Kickpanel, the shop's vehicle fitment wiki.`,
		`Your role will be ${input.role}: you can ${can}.`,
		``,
		`Choose your name and a password here:`,
		input.link,
		``,
		`The link works once and stops working at ${at(input.expiresAt, input.timeZone)}.`,
		`If you were not expecting this, ignore it: no account exists until the link is used.`
	].join('\n');
	const html = page(
		subject,
		`<p>Hello,</p>
<p>${escapeHtml(input.inviterName)} has invited you to ${escapeHtml(input.shopName)}'s Kickpanel, the shop's vehicle fitment wiki.
Your role will be <strong>${escapeHtml(input.role)}</strong>: you can ${escapeHtml(can)}.</p>
${button(input.link, 'Set up my account')}
<p>The link works once and stops working at ${escapeHtml(at(input.expiresAt, input.timeZone))}.</p>`,
		'If you were not expecting this, ignore it: no account exists until the link is used.'
	);
	return { subject, text, html };
}

export function resetMail(input: { shopName: string; name: string; link: string; expiresAt: Date; timeZone?: string }): MailBody {
	const subject = `Reset your Kickpanel password`;
	const text = [
		`Hello ${input.name},`,
		``,
		`Someone asked to reset the password of your account at ${input.shopName}'s Kickpanel.`,
		`Choose a new password here:`,
		input.link,
		``,
		`The link works once and stops working at ${at(input.expiresAt, input.timeZone)}. Setting a new password signs you out everywhere.`,
		`If you did not ask for this, ignore this message: your password stays as it is.`
	].join('\n');
	const html = page(
		subject,
		`<p>Hello ${escapeHtml(input.name)},</p>
<p>Someone asked to reset the password of your account at ${escapeHtml(input.shopName)}'s Kickpanel.</p>
${button(input.link, 'Choose a new password')}
<p>The link works once and stops working at ${escapeHtml(at(input.expiresAt, input.timeZone))}. Setting a new password signs you out everywhere.</p>`,
		'If you did not ask for this, ignore this message: your password stays as it is.'
	);
	return { subject, text, html };
}

/** One update to a followed car, as a notice shows it. */
export type ChangeLine = {
	vehicleTitle: string;
	pageLink: string;
	compareLink: string | null;
	editorName: string;
	summary: string | null;
	when: Date;
	isNewPage: boolean;
	/** The shop's zone the time is shown in. */
	timeZone?: string;
};

const didWhat = (c: ChangeLine) => (c.isNewPage ? 'started the page for' : 'updated');
const noteText = (c: ChangeLine) => (c.summary === null ? '(change note hidden by a moderator)' : c.summary || '(no change note)');

function changeText(c: ChangeLine): string {
	return [
		`${c.editorName} ${didWhat(c)} ${c.vehicleTitle} — ${at(c.when, c.timeZone)}`,
		`  Change note: ${noteText(c)}`,
		`  ${c.compareLink ? `Show what changed: ${c.compareLink}` : `Open the page: ${c.pageLink}`}`
	].join('\n');
}

function changeHtml(c: ChangeLine): string {
	const note = c.summary === null ? `<em>${escapeHtml(noteText(c))}</em>` : escapeHtml(noteText(c));
	const link = c.compareLink
		? `<a href="${escapeHtml(c.compareLink)}" style="color:#964d20">Show what changed</a>`
		: `<a href="${escapeHtml(c.pageLink)}" style="color:#964d20">Open the page</a>`;
	return `<li style="margin-bottom:12px">${escapeHtml(c.editorName)} ${didWhat(c)} <a href="${escapeHtml(c.pageLink)}" style="color:#1c1a17;font-weight:600">${escapeHtml(c.vehicleTitle)}</a> — ${escapeHtml(at(c.when, c.timeZone))}<br>Change note: ${note}<br>${link}</li>`;
}

function noticeFooterText(accountLink: string, followingLink: string): string {
	return [
		`You get this because you follow these cars.`,
		`Unfollow a car from the list of cars you follow: ${followingLink}`,
		`Choose notices at once or one round-up a day on your account page: ${accountLink}`
	].join('\n');
}

function noticeFooterHtml(accountLink: string, followingLink: string): string {
	return `You get this because you follow these cars. Unfollow a car from <a href="${escapeHtml(followingLink)}">the cars you follow</a>; choose notices at once or one round-up a day on <a href="${escapeHtml(accountLink)}">your account page</a>.`;
}

type NoticeLinks = { accountLink: string; followingLink: string };

export function changeNoticeMail(input: { recipientName: string; change: ChangeLine } & NoticeLinks): MailBody {
	const c = input.change;
	const subject = `${c.editorName} ${didWhat(c)} ${c.vehicleTitle}`;
	const text = [`Hello ${input.recipientName},`, ``, changeText(c), ``, noticeFooterText(input.accountLink, input.followingLink)].join('\n');
	const html = page(
		subject,
		`<p>Hello ${escapeHtml(input.recipientName)},</p><ul style="padding-left:18px">${changeHtml(c)}</ul>`,
		noticeFooterHtml(input.accountLink, input.followingLink)
	);
	return { subject, text, html };
}

export function digestMail(input: { recipientName: string; changes: ChangeLine[] } & NoticeLinks): MailBody {
	const cars = new Set(input.changes.map((c) => c.pageLink)).size;
	const count = input.changes.length;
	const subject = `Today on the cars you follow: ${count} ${count === 1 ? 'update' : 'updates'} to ${cars} ${cars === 1 ? 'car' : 'cars'}`;
	const text = [
		`Hello ${input.recipientName},`,
		``,
		`Since your last round-up:`,
		``,
		input.changes.map(changeText).join('\n\n'),
		``,
		noticeFooterText(input.accountLink, input.followingLink)
	].join('\n');
	const html = page(
		subject,
		`<p>Hello ${escapeHtml(input.recipientName)},</p><p>Since your last round-up:</p><ul style="padding-left:18px">${input.changes.map(changeHtml).join('\n')}</ul>`,
		noticeFooterHtml(input.accountLink, input.followingLink)
	);
	return { subject, text, html };
}

/** A writer hears what a moderator did with the change they suggested for a locked page. */
export function suggestionAnsweredMail(input: {
	recipientName: string;
	moderatorName: string;
	vehicleTitle: string;
	outcome: 'applied' | 'declined';
	note: string;
	link: string;
	when: Date;
	timeZone?: string;
}): MailBody {
	const did = input.outcome === 'applied' ? 'applied' : 'declined';
	const subject = `${input.moderatorName} ${did} your suggested change to ${input.vehicleTitle}`;
	const result = input.outcome === 'applied' ? 'It is now part of the page.' : 'The page stays as it was.';
	const note = input.note ? `Note from ${input.moderatorName}: ${input.note}` : `${input.moderatorName} left no note.`;
	const text = [`Hello ${input.recipientName},`, ``, `${subject} — ${at(input.when, input.timeZone)}.`, result, note, ``, `Your suggestion: ${input.link}`].join('\n');
	const html = page(
		subject,
		`<p>Hello ${escapeHtml(input.recipientName)},</p>
<p>${escapeHtml(subject)} — ${escapeHtml(at(input.when, input.timeZone))}. ${escapeHtml(result)}</p>
<p>${escapeHtml(note)}</p>
${button(input.link, 'Open your suggestion')}`,
		'You get this because you suggested a change to a page locked for moderators.'
	);
	return { subject, text, html };
}
