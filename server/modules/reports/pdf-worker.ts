/**
 * Worker thread of the PDF pool (piscina): checks the logo, makes every printed string printable
 * and renders the report. Whatever the PDF library throws, here or from one of its callbacks, ends
 * only this thread; the pool answers the request and starts another.
 */
import { LONE_SURROGATE } from '@shared/api/safe-text';
import type { ReportView } from '@shared/reports/report-schemas';
import { checkLogo, type LogoType } from './logo-check';
import { reportPdf } from './report-pdf';

export interface PdfTask {
  view: ReportView;
  logo: { contentType: string; content: Uint8Array } | null;
}

export type PdfTaskResult = { pdf: Uint8Array } | { logoRefused: string };

// Format characters (zero-width spaces and joiners, byte-order marks, direction marks) and control
// characters other than line breaks and tabs have no glyph in the report's fonts: they are dropped.
const UNPRINTABLE = /[\p{Cf}\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/gu;
const LONE_SURROGATES = new RegExp(LONE_SURROGATE.source, 'g');

// A scan of every character of the Basic Multilingual Plane through the report's fonts found one
// more that stops the PDF writer once the above are dropped: the thin space, printed as a space.
const THIN_SPACE = /\u2009/g;

/** The text with unprintable characters dropped, a thin space as a space and a lone surrogate shown as "?". */
export function printable(text: string): string {
  return text.replace(LONE_SURROGATES, '?').replace(UNPRINTABLE, '').replace(THIN_SPACE, ' ');
}

function printableDeep<T>(value: T): T {
  if (typeof value === 'string') return printable(value) as T;
  if (Array.isArray(value)) return value.map(printableDeep) as T;
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, printableDeep(v)])) as T;
  }
  return value;
}

export default async function renderPdfTask(task: PdfTask): Promise<PdfTaskResult> {
  let logo: { contentType: string; content: Buffer } | null = null;
  if (task.logo) {
    const type = task.logo.contentType as LogoType;
    const checked = checkLogo(
      type,
      Buffer.from(task.logo.content.buffer, task.logo.content.byteOffset, task.logo.content.byteLength),
    );
    if (!checked.ok) return { logoRefused: checked.reason };
    logo = { contentType: type, content: checked.content };
  }
  const pdf = await reportPdf(printableDeep(task.view), logo);
  return { pdf: new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.byteLength) };
}
