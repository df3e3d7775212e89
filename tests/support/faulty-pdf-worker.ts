/**
 * A PDF worker that fails on purpose, as a PDF library can: the report's title says how. Used to
 * show that the pool survives its workers, not to make PDFs.
 */
import type { PdfTask, PdfTaskResult } from '../../server/modules/reports/pdf-worker';

const never = () => new Promise<never>(() => undefined);

export default async function faultyPdfWorker(task: PdfTask): Promise<PdfTaskResult> {
  const how = task.view.title;
  if (how === 'throw from a callback' || (how === 'fail on the logo' && task.logo)) {
    setTimeout(() => {
      throw new Error('thrown from a callback, outside any promise');
    }, 5);
    return never();
  }
  if (how === 'take forever') return never();
  return { pdf: new TextEncoder().encode(`%PDF-1.7 ${how} (thread ${process.pid})`) };
}
