/**
 * The PDF pool: reports are rendered in worker threads, so that a PDF library failing on one
 * organisation's logo or text ends one worker and answers one request, never the server. A render
 * that takes too long is stopped, and its worker with it.
 */
import type { Logger } from 'pino';
import { Piscina } from 'piscina';
import type { ReportView } from '@shared/reports/report-schemas';
import { HttpError } from '../../http/http-error';
import type { PdfTask, PdfTaskResult } from './pdf-worker';

export interface PdfPool {
  /** The report as PDF bytes; an HttpError naming the cause when it cannot be produced. */
  render(view: ReportView, logo: { contentType: string; content: Buffer } | null): Promise<Buffer>;
  close(): Promise<void>;
}

export const logoUnreadable = (reason: string) =>
  new HttpError(
    422,
    'logo_unreadable',
    'The firm’s logo could not be read, so the PDF could not be made; upload the logo again (or remove it).',
    [{ path: 'logo', message: reason }],
  );

export const pdfFailed = (why: string) =>
  new HttpError(
    500,
    'pdf_failed',
    `The PDF could not be made (${why}); the report itself is unchanged and its page still opens. Try again.`,
  );

export function createPdfPool(
  options: { filename?: string; maxThreads?: number; timeoutMs?: number; logger?: Logger } = {},
): PdfPool {
  const piscina = new Piscina<PdfTask, PdfTaskResult>({
    filename: options.filename ?? new URL('./pdf-worker.ts', import.meta.url).href,
    minThreads: 0,
    maxThreads: options.maxThreads ?? 2,
    idleTimeout: 60_000,
    // A runaway image cannot take the server's memory with it.
    resourceLimits: { maxOldGenerationSizeMb: 512 },
  });
  const timeoutMs = options.timeoutMs ?? 30_000;

  async function run(task: PdfTask): Promise<PdfTaskResult> {
    return piscina.run(task, { signal: AbortSignal.timeout(timeoutMs) });
  }

  const causeOf = (err: unknown) =>
    err instanceof Error && err.name === 'AbortError'
      ? `it took longer than ${timeoutMs / 1000} s`
      : 'the PDF writer failed';

  return {
    async render(view, logo) {
      const task: PdfTask = {
        view,
        logo: logo ? { contentType: logo.contentType, content: new Uint8Array(logo.content) } : null,
      };
      let result: PdfTaskResult;
      try {
        result = await run(task);
      } catch (err) {
        options.logger?.error({ err, withLogo: logo !== null }, 'a PDF render failed; its worker was replaced');
        if (!logo) throw pdfFailed(causeOf(err));
        // Was it the logo? The same report without it tells.
        try {
          await run({ ...task, logo: null });
        } catch {
          throw pdfFailed(causeOf(err));
        }
        throw logoUnreadable('the PDF writer could not print this image');
      }
      if ('logoRefused' in result) throw logoUnreadable(result.logoRefused);
      return Buffer.from(result.pdf.buffer, result.pdf.byteOffset, result.pdf.byteLength);
    },
    async close() {
      await piscina.destroy();
    },
  };
}
