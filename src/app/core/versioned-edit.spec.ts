import { HttpErrorResponse } from '@angular/common/http';
import { signal } from '@angular/core';
import { FormControl, FormGroup } from '@angular/forms';
import { applyApiErrors } from './api-errors';
import { VersionedEdit } from './versioned-edit';

interface Note {
  id: string;
  version: number;
  text: string;
}

const FIRST: Note = { id: 'n1', version: 3, text: 'Boiler room' };
const THEIRS: Note = { id: 'n1', version: 4, text: 'Boiler room, north wall' };

/** The body the API answers when someone saved since (see the error shape in DEVELOPERS.md). */
function staleAnswer(): HttpErrorResponse {
  return new HttpErrorResponse({
    status: 409,
    url: '/api/v1/notes/n1',
    error: {
      error: {
        code: 'stale_update',
        message: 'Robin Ash changed this note since you opened it; reload to see their changes, then apply yours again',
      },
    },
  });
}

function invalidAnswer(): HttpErrorResponse {
  return new HttpErrorResponse({
    status: 400,
    url: '/api/v1/notes/n1',
    error: {
      error: {
        code: 'invalid_input',
        message: 'Some fields are not valid',
        details: [{ path: 'text', message: 'Use at most 40 characters' }],
      },
    },
  });
}

/** A request the API refuses with `answer` (HttpClient rejects with the HttpErrorResponse itself). */
function refusal(answer: HttpErrorResponse): () => Promise<never> {
  return () => jasmine.createSpy('refused').and.rejectWith(answer)() as Promise<never>;
}

/** A promise with its resolve and reject at hand, to hold a request open. */
function deferred<T>() {
  let resolve!: (value: T) => void;
  let reject!: (err: unknown) => void;
  const promise = new Promise<T>((res, rej) => {
    resolve = res;
    reject = rej;
  });
  return { promise, resolve, reject };
}

describe('VersionedEdit', () => {
  it('saves from the record’s version and keeps the answer as the new record', async () => {
    const edit = new VersionedEdit<Note>({ record: signal(FIRST) });
    const sent: number[] = [];
    const saved = await edit.save((n) => {
      sent.push(n.version);
      return Promise.resolve({ ...n, version: n.version + 1, text: 'Boiler room, east' });
    });
    expect(sent).toEqual([3]);
    expect(saved?.version).toBe(4);
    expect(edit.record()?.text).toBe('Boiler room, east');
    expect(edit.isPending()).toBeFalse();
    expect(edit.error()).toBe('');
  });

  it('sends once when Save is pressed twice before the first answer', async () => {
    const edit = new VersionedEdit<Note>({ record: signal(FIRST) });
    const answer = deferred<Note>();
    const request = jasmine.createSpy('request').and.returnValue(answer.promise);

    const first = edit.save(request);
    const second = edit.save(request);
    expect(edit.isPending()).toBeTrue();
    expect(await second).toBeNull();
    answer.resolve({ ...FIRST, version: 4 });
    expect((await first)?.version).toBe(4);
    expect(request).toHaveBeenCalledTimes(1);
    expect(edit.isPending()).toBeFalse();
  });

  it('refuses a reload while a save is pending', async () => {
    const load = jasmine.createSpy('load').and.resolveTo(THEIRS);
    const edit = new VersionedEdit<Note>({ record: signal(FIRST), load });
    const answer = deferred<Note>();
    const saving = edit.save(() => answer.promise);
    expect(await edit.reload()).toBeNull();
    expect(load).not.toHaveBeenCalled();
    answer.resolve(FIRST);
    await saving;
  });

  it('on a stale save keeps the record, names who saved, and reloads theirs on request', async () => {
    const load = jasmine.createSpy('load').and.resolveTo(THEIRS);
    const placeErrors = jasmine.createSpy('placeErrors').and.returnValue('placed');
    const edit = new VersionedEdit<Note>({ record: signal(FIRST), load, placeErrors });

    const saved = await edit.save(refusal(staleAnswer()));
    expect(saved).toBeNull();
    expect(edit.isStale()).toBeTrue();
    expect(edit.error()).toContain('Robin Ash');
    expect(placeErrors).not.toHaveBeenCalled();
    expect(edit.record()).toBe(FIRST);

    const latest = await edit.reload();
    expect(load).toHaveBeenCalledOnceWith(FIRST);
    expect(latest).toBe(THEIRS);
    expect(edit.record()).toBe(THEIRS);
    expect(edit.isStale()).toBeFalse();
    expect(edit.error()).toBe('');

    // The next save is made from their version.
    const versions: number[] = [];
    await edit.save((n) => {
      versions.push(n.version);
      return Promise.resolve({ ...n, version: 5 });
    });
    expect(versions).toEqual([4]);
  });

  it('keeps the stale state and shows why when the reload itself fails', async () => {
    const offline = new HttpErrorResponse({ status: 0, url: '/api/v1/notes/n1' });
    const edit = new VersionedEdit<Note>({ record: signal(FIRST), load: refusal(offline) });
    await edit.save(refusal(staleAnswer()));
    expect(await edit.reload()).toBeNull();
    expect(edit.record()).toBe(FIRST);
    expect(edit.isStale()).toBeTrue();
    expect(edit.error()).toContain('could not be reached');
  });

  it('without a way to reload shows a stale save like any other refusal', async () => {
    const form = new FormGroup({ text: new FormControl('') });
    const edit = new VersionedEdit<Note>({ record: signal(FIRST), placeErrors: (e) => applyApiErrors(form, e) });
    await edit.save(refusal(staleAnswer()));
    expect(edit.isStale()).toBeFalse();
    expect(edit.error()).toContain('Robin Ash');
  });

  it('puts the field details of a refused save on the form', async () => {
    const form = new FormGroup({ text: new FormControl('x'.repeat(50)) });
    const edit = new VersionedEdit<Note>({
      record: signal(FIRST),
      load: () => Promise.resolve(THEIRS),
      placeErrors: (e) => applyApiErrors(form, e),
    });
    await edit.save(refusal(invalidAnswer()));
    expect(form.controls.text.errors).toEqual({ server: 'Use at most 40 characters' });
    expect(edit.error()).toBe('Some fields are not valid');
    expect(edit.isStale()).toBeFalse();
    expect(edit.record()).toBe(FIRST);
  });

  it('sends nothing before a record is loaded', async () => {
    const edit = new VersionedEdit<Note>();
    const request = jasmine.createSpy('request');
    expect(await edit.save(request)).toBeNull();
    expect(request).not.toHaveBeenCalled();
  });

  it('saves over the latest version when asked to, once', async () => {
    const load = jasmine.createSpy('load').and.resolveTo(THEIRS);
    const edit = new VersionedEdit<Note>({ record: signal(FIRST), load });
    const versions: number[] = [];
    const saved = await edit.saveOverLatest((n) => {
      versions.push(n.version);
      return n.version === FIRST.version ? refusal(staleAnswer())() : Promise.resolve({ ...n, version: n.version + 1 });
    });
    expect(versions).toEqual([3, 4]);
    expect(saved?.version).toBe(5);
    expect(edit.record()?.version).toBe(5);
    expect(edit.isStale()).toBeFalse();
  });

  it('gives up after one retry when the record keeps changing', async () => {
    const edit = new VersionedEdit<Note>({ record: signal(FIRST), load: () => Promise.resolve(THEIRS) });
    const request = jasmine.createSpy('request').and.callFake(refusal(staleAnswer()));
    expect(await edit.saveOverLatest(request)).toBeNull();
    expect(request).toHaveBeenCalledTimes(2);
    expect(edit.isStale()).toBeTrue();
  });

  it('shows a check made before sending and forgets it on clear', () => {
    const edit = new VersionedEdit<Note>({ record: signal(FIRST) });
    edit.refuse('Some values need attention');
    expect(edit.error()).toBe('Some values need attention');
    edit.clear();
    expect(edit.error()).toBe('');
  });
});
