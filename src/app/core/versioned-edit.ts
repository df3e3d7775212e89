import { signal, type WritableSignal } from '@angular/core';
import { apiErrorCode, apiErrorMessage } from './api-errors';

/** The one code the API answers (409) when someone saved the record since its `version` was read. */
const STALE = 'stale_update';

export interface VersionedEditOptions<T> {
  /**
   * The record as last loaded or saved: the next save is made from it (its `version`). Give the
   * component's own signal (a `linkedSignal` of an input, say); by default the edit keeps one.
   */
  record?: WritableSignal<T | null>;
  /**
   * Fetches the record as saved now, after someone else saved first. Without it a stale save is
   * shown like any other failure and no reload is offered.
   */
  load?: (current: T) => Promise<T>;
  /**
   * Puts the field details of a refused save on their fields and answers the message left to show
   * above the form (`applyApiErrors` for a plain form). By default the API's message is shown.
   */
  placeErrors?: (err: unknown) => string;
}

/**
 * The save → stale → reload flow of an editor of a versioned record (projects, buildings, equipment
 * lists, energy prices, scenarios):
 * - one request at a time: a save or reload asked for while one is pending is ignored (a double
 *   click sends once);
 * - a save names the version it started from; on success its answer becomes the record;
 * - a 409 `stale_update` keeps the typed values, shows the API's message (which names the person
 *   who saved since) and sets `isStale`, so the page can offer Reload;
 * - any other refusal puts its field details on the form through `placeErrors`;
 * - `reload()` fetches the latest saved record; the page decides what happens to the typed values.
 */
export class VersionedEdit<T> {
  /** The record saves are made from. */
  readonly record: WritableSignal<T | null>;
  private readonly pendingState = signal(false);
  private readonly errorState = signal('');
  private readonly staleState = signal(false);

  /** A save or reload is under way. */
  readonly isPending = this.pendingState.asReadonly();
  /** The message to show above the form ('' when none). */
  readonly error = this.errorState.asReadonly();
  /** The last save was refused because someone saved first; `reload()` fetches theirs. */
  readonly isStale = this.staleState.asReadonly();

  constructor(private readonly options: VersionedEditOptions<T> = {}) {
    this.record = options.record ?? signal<T | null>(null);
  }

  /**
   * Sends `request(record)` (a save that names the record's version). Its answer becomes the record
   * and is returned; null when nothing was sent (no record yet, or another request pending) or when
   * the save was refused (see `error` and `isStale`).
   */
  async save(request: (current: T) => Promise<T>): Promise<T | null> {
    const current = this.record();
    if (current === null) return null;
    const saved = await this.send(() => request(current));
    if (saved !== null) this.record.set(saved);
    return saved;
  }

  /**
   * Sends any write under the same rules as `save` (one at a time, errors and staleness shown) but
   * leaves the record as it is: for a create, or a save whose answer is not the record itself.
   */
  async send<R>(request: () => Promise<R>): Promise<R | null> {
    if (this.pendingState()) return null;
    this.pendingState.set(true);
    this.clear();
    try {
      return await request();
    } catch (err) {
      this.refused(err);
      return null;
    } finally {
      this.pendingState.set(false);
    }
  }

  /**
   * Saves over the latest version without asking: on a stale answer the record is fetched again and
   * the same change sent once more from it. For a choice the user has no form to reconcile, such as
   * the chosen design point of a scenario.
   */
  async saveOverLatest(request: (current: T) => Promise<T>): Promise<T | null> {
    const saved = await this.save(request);
    if (saved !== null || !this.isStale()) return saved;
    return (await this.reload()) === null ? null : this.save(request);
  }

  /**
   * Fetches the record as saved now and makes it the record (the next save is made from its
   * version). Answers it, or null when nothing was fetched (see `error`).
   */
  async reload(): Promise<T | null> {
    const current = this.record();
    const load = this.options.load;
    if (current === null || !load || this.pendingState()) return null;
    this.pendingState.set(true);
    this.errorState.set('');
    try {
      const latest = await load(current);
      this.record.set(latest);
      this.staleState.set(false);
      return latest;
    } catch (err) {
      this.errorState.set(apiErrorMessage(err));
      return null;
    } finally {
      this.pendingState.set(false);
    }
  }

  /** Shows a problem found before anything was sent (the form's own checks). */
  refuse(message: string): void {
    this.errorState.set(message);
    this.staleState.set(false);
  }

  /** Forgets the message and the staleness (after Discard, or when another record is shown). */
  clear(): void {
    this.errorState.set('');
    this.staleState.set(false);
  }

  private refused(err: unknown): void {
    if (this.options.load && apiErrorCode(err) === STALE) {
      this.staleState.set(true);
      this.errorState.set(apiErrorMessage(err));
      return;
    }
    this.errorState.set(this.options.placeErrors ? this.options.placeErrors(err) : apiErrorMessage(err));
  }
}
