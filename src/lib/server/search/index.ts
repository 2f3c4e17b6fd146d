// The search index each app instance keeps in memory. MariaDB is the truth; this is a cache of it:
// built at start-up, updated in the request that writes a revision, and caught up by polling so that
// several instances behind a load balancer stay in step with each other's saves.
import { logFailure } from '../observability/log';
import { error } from '@sveltejs/kit';
import type { SearchSection } from '../../domain/search/document';
import { vehicleSearchSections } from '../../domain/search/document';
import type { SearchFilters } from '../../domain/search/filters';
import { onRevisionWritten } from '../events';
import { config } from '../config';
import { VehicleSearchEngine } from './engine';
import { withNoteSnippet } from './hits';
import type { SearchOutcome, VinCandidate } from './types';
import { newestRevisionId, pagesChangedAfter, pagesTouchedSince, revisionContents, shownRevisions, shownRevisionsOf } from './source';
import { readingRules, rulesKey } from '../services/readingRules';

/** Revision ids are handed out before commit, so a slower transaction can land below the newest id seen; look back this far. */
const POLL_OVERLAP = 200;
const SNIPPET_TEXT_CACHE = 2_000;
const DEFAULT_POLL_MS = 5_000;
/** A page row touched in a transaction that commits late carries an earlier time; look back this far. */
const POLL_TOUCH_OVERLAP_MS = 30_000;

export type IndexState = 'empty' | 'building' | 'ready' | 'failed';

export class LiveSearchIndex {
	private engine = new VehicleSearchEngine();
	private built: Promise<VehicleSearchEngine> | null = null;
	private rebuilding = false;
	private watermark = 0;
	private timer: ReturnType<typeof setInterval> | null = null;
	private unsubscribe: (() => void) | null = null;
	private polling: Promise<number> | null = null;
	private sectionText = new Map<number, SearchSection[]>();
	/** The reading rules the index was built under, and when pages were last looked at for hides and sign-offs. */
	private rules = '';
	private touchedSince = new Date(0);
	state: IndexState = 'empty';
	lastError: string | null = null;

	/** The newest revision id the index has taken in (the metrics report the lag behind the database). */
	get caughtUpTo(): number {
		return this.watermark;
	}

	/** Listens for revisions written by this process and polls for the rest; the build starts in the background. */
	start(opts: { pollMs?: number; listen?: boolean } = {}): void {
		if (opts.listen !== false && !this.unsubscribe) {
			this.unsubscribe = onRevisionWritten(async (event) => {
				await this.ready();
				await this.refresh([event.vehicleId]);
			});
		}
		const pollMs = opts.pollMs ?? DEFAULT_POLL_MS;
		if (pollMs > 0 && !this.timer) {
			this.timer = setInterval(() => {
				this.catchUp().catch((err) => this.fail('catching up', err));
			}, pollMs);
			this.timer.unref();
		}
		this.ready().catch(() => undefined);
	}

	stop(): void {
		this.unsubscribe?.();
		this.unsubscribe = null;
		if (this.timer) clearInterval(this.timer);
		this.timer = null;
	}

	private fail(doing: string, err: unknown) {
		this.lastError = err instanceof Error ? err.message : String(err);
		logFailure(`search index: failed ${doing}`, err);
	}

	/** The built engine; builds it on first use, and again after a failed build. */
	ready(): Promise<VehicleSearchEngine> {
		if (!this.built) {
			this.state = 'building';
			this.built = this.build().then(
				(engine) => {
					this.engine = engine;
					this.state = 'ready';
					this.lastError = null;
					return engine;
				},
				(err) => {
					this.built = null;
					this.state = 'failed';
					this.fail('building', err);
					error(503, 'Search is not available right now: the database could not be read. Try again in a moment.');
				}
			);
		}
		return this.built;
	}

	private async build(): Promise<VehicleSearchEngine> {
		const engine = new VehicleSearchEngine();
		// Read the newest id first: anything written while the pages are read is caught up below.
		const mark = await newestRevisionId();
		const touched = new Date(Date.now() - POLL_TOUCH_OVERLAP_MS);
		const rules = await readingRules();
		for await (const batch of shownRevisions(rules)) engine.putMany(batch);
		engine.warm();
		this.watermark = mark;
		this.touchedSince = touched;
		this.rules = rulesKey(rules);
		await this.catchUpInto(engine);
		return engine;
	}

	/** Re-reads pages from the database and puts the revision everyone may read in the index (none: the page leaves it). */
	async refresh(vehicleIds: number[]): Promise<void> {
		await this.putShown(this.engine, vehicleIds);
	}

	/** Puts each page's shown revision; returns how many pages changed in the index. */
	private async putShown(engine: VehicleSearchEngine, vehicleIds: number[]): Promise<number> {
		const inputs = await shownRevisionsOf(vehicleIds, await readingRules());
		let changed = 0;
		for (const input of inputs) {
			// A hide can move the shown revision back to an older one.
			if ((engine.revisionOf(input.id) ?? 0) > input.revisionId) engine.remove(input.id);
			if (engine.put(input)) changed++;
		}
		const found = new Set(inputs.map((i) => i.id));
		for (const id of vehicleIds) {
			if (found.has(id) || engine.revisionOf(id) === null) continue;
			engine.remove(id);
			changed++;
		}
		return changed;
	}

	/** One polling step: indexes pages whose newest revision is newer than the one held. Returns how many changed. */
	catchUp(): Promise<number> {
		if (this.state !== 'ready') return this.ready().then(() => 0);
		if (!this.polling) {
			this.polling = this.catchUpInto(this.engine).finally(() => {
				this.polling = null;
			});
		}
		return this.polling;
	}

	private async catchUpInto(engine: VehicleSearchEngine): Promise<number> {
		// The shop switched sign-off on or off (here or on another server): every page may read differently.
		// Read fresh, so another server's switch is seen at this poll rather than one cache lifetime later.
		if (engine === this.engine && this.rules && this.rules !== rulesKey(await readingRules({ fresh: true }))) {
			this.built = null;
			await this.ready();
			return engine.size;
		}
		const touchedAt = new Date(Date.now() - POLL_TOUCH_OVERLAP_MS);
		const changed = await pagesChangedAfter(Math.max(0, this.watermark - POLL_OVERLAP));
		const touched = await pagesTouchedSince(this.touchedSince);
		this.touchedSince = touchedAt;
		const stale = new Set(changed.filter((c) => (engine.revisionOf(c.vehicleId) ?? 0) < c.revisionId).map((c) => c.vehicleId));
		for (const id of touched) stale.add(id);
		const updated = stale.size ? await this.putShown(engine, [...stale]) : 0;
		for (const c of changed) this.watermark = Math.max(this.watermark, c.revisionId);
		this.compactIfNeeded(engine);
		return updated;
	}

	/** Replaced pages leave retired slots behind; past a fifth of the index a fresh build replaces it. */
	private compactIfNeeded(engine: VehicleSearchEngine) {
		if (this.rebuilding || engine !== this.engine || engine.retired < Math.max(1_000, engine.size / 5)) return;
		this.rebuilding = true;
		this.build()
			.then((fresh) => {
				this.engine = fresh;
				this.built = Promise.resolve(fresh);
			})
			.catch((err) => this.fail('rebuilding', err))
			.finally(() => {
				this.rebuilding = false;
			});
	}

	status() {
		return { state: this.state, pages: this.engine.size, retired: this.engine.retired, watermark: this.watermark, lastError: this.lastError };
	}

	async search(filters: SearchFilters, opts: { limit: number; offset?: number }): Promise<SearchOutcome & { tookMs: number }> {
		const engine = await this.ready();
		const started = performance.now();
		const outcome = engine.search(filters, { ...opts, referenceYear: new Date().getUTCFullYear() });
		const missing = outcome.items.filter((h) => h.noteWords.length && !this.sectionText.has(h.revisionId)).map((h) => h.revisionId);
		if (missing.length) {
			for (const [id, content] of await revisionContents(missing)) this.rememberText(id, vehicleSearchSections(content));
		}
		outcome.items = outcome.items.map((h) => (h.noteWords.length ? withNoteSnippet(h, this.textOf(h.revisionId)) : h));
		return { ...outcome, tookMs: Math.round((performance.now() - started) * 1000) / 1000 };
	}

	private textOf(revisionId: number): SearchSection[] | null {
		const text = this.sectionText.get(revisionId);
		if (!text) return null;
		this.sectionText.delete(revisionId);
		this.sectionText.set(revisionId, text);
		return text;
	}

	private rememberText(revisionId: number, sections: SearchSection[]) {
		if (this.sectionText.size >= SNIPPET_TEXT_CACHE) this.sectionText.delete(this.sectionText.keys().next().value!);
		this.sectionText.set(revisionId, sections);
	}

	async vinCandidates(vin: string, decoded: { make: string; model: string } | null, modelYear: number | null): Promise<VinCandidate[]> {
		return (await this.ready()).vinCandidates(vin, decoded, modelYear);
	}

	async makes() {
		return (await this.ready()).makeList();
	}
}

let shared: LiveSearchIndex | null = null;

/** This process's index, started on first use (start-up calls it early so the build runs in the background). */
export function searchIndex(): LiveSearchIndex {
	if (!shared) {
		shared = new LiveSearchIndex();
		shared.start({ pollMs: config.searchPollMs });
	}
	return shared;
}

export function stopSearchIndex(): void {
	shared?.stop();
	shared = null;
}
