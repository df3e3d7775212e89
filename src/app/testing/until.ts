import type { HttpTestingController, TestRequest } from '@angular/common/http/testing';

type RequestMatch = Parameters<HttpTestingController['match']>[0];

/**
 * Waits (a task at a time, at most `timeoutMs`) until `condition` holds, instead of a fixed number
 * of ticks; fails with `what` when it never does. The condition may be asynchronous, as component
 * harness reads are.
 */
export async function until(
  condition: () => boolean | Promise<boolean>,
  what = 'the condition',
  timeoutMs = 3000,
): Promise<void> {
  const start = Date.now();
  while (!(await condition())) {
    if (Date.now() - start > timeoutMs) throw new Error(`Waited ${timeoutMs} ms for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 0));
  }
}

/** Waits until the page has sent one request matching `match`, and answers it like `expectOne`. */
export async function nextRequest(
  http: HttpTestingController,
  match: RequestMatch,
  timeoutMs = 3000,
): Promise<TestRequest> {
  let found: TestRequest[] = [];
  await until(
    () => {
      found = http.match(match);
      return found.length > 0;
    },
    `a request matching ${JSON.stringify(match)}`,
    timeoutMs,
  );
  if (found.length > 1)
    throw new Error(`Expected one request matching ${JSON.stringify(match)}, found ${found.length}`);
  const [request] = found;
  if (!request) throw new Error('No request');
  return request;
}
