/**
 * The report as a PDF (pdfmake with the shipped Source Sans 3 fonts; no network or file access
 * beyond those fonts). The chart is the report chart rendered to SVG by ECharts on the server.
 */
import { createRequire } from 'node:module';
import path from 'node:path';
import * as echarts from 'echarts';
import type { ReportView } from '@shared/reports/report-schemas';
import { reportChartOption } from '@shared/reports/report-chart';
import { SIZING_CAUTIONS_TITLE } from '@shared/reports/cautions';

const require = createRequire(import.meta.url);

interface PdfDocument {
  getBuffer(): Promise<Buffer>;
}
interface PdfMake {
  setUrlAccessPolicy(cb: (url: string) => boolean): void;
  setLocalAccessPolicy(cb: (p: string) => boolean): void;
  addFonts(fonts: Record<string, Record<string, string>>): void;
  createPdf(doc: Record<string, unknown>): PdfDocument;
}

const FONT_DIR = path.dirname(require.resolve('@fontsource/source-sans-3/files/source-sans-3-latin-400-normal.woff'));
let pdfmake: PdfMake | null = null;

function printer(): PdfMake {
  if (pdfmake) return pdfmake;
  const p = require('pdfmake') as PdfMake;
  p.setUrlAccessPolicy(() => false);
  p.setLocalAccessPolicy((file) => path.resolve(file).startsWith(FONT_DIR + path.sep));
  const f = (weight: number, style: string) => path.join(FONT_DIR, `source-sans-3-latin-${weight}-${style}.woff`);
  p.addFonts({ SourceSans: { normal: f(400, 'normal'), bold: f(700, 'normal'), italics: f(400, 'italic'), bolditalics: f(700, 'italic') } });
  pdfmake = p;
  return p;
}

/** The report chart as an SVG string. */
export function reportChartSvg(view: ReportView, width = 515, height = 230): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width, height });
  chart.setOption(reportChartOption(view, { compact: false, forPrint: true }));
  const svg = chart.renderToSVGString();
  chart.dispose();
  return svg;
}

const INK = '#1D4E5F';
/** Ember's darker text tone (4.8:1 on white paper); the base ember is for marks and lines only. */
const EMBER_TEXT = '#B44E33';

export async function reportPdf(view: ReportView, logo: { contentType: string; content: Buffer } | null): Promise<Buffer> {
  const header: unknown[] = [];
  if (logo) {
    header.push(
      logo.contentType === 'image/svg+xml'
        ? { svg: logo.content.toString('utf8'), fit: [140, 48], margin: [0, 0, 0, 6] }
        : { image: `data:${logo.contentType};base64,${logo.content.toString('base64')}`, fit: [140, 48], margin: [0, 0, 0, 6] },
    );
  }
  const optionBlocks = view.options.map((o) => ({
    stack: [
      { text: o.heading, style: 'h3' },
      { text: o.unit, bold: true, color: EMBER_TEXT, margin: [0, 2, 0, 2] },
      { text: `Capacity at ${o.temperature}: ${o.capacity}`, fontSize: 9, color: '#555' },
      {
        table: { widths: ['*', 'auto'], body: o.figures.map((f) => [{ text: f.label, fontSize: 9 }, { text: f.text, fontSize: 9, bold: true, alignment: 'right' }]) },
        layout: 'lightHorizontalLines',
        margin: [0, 4, 0, 4],
      },
    ],
  }));
  const doc = {
    pageSize: 'A4',
    pageMargins: [40, 40, 40, 48],
    defaultStyle: { font: 'SourceSans', fontSize: 10.5, lineHeight: 1.2, color: '#1b2a30' },
    styles: {
      firm: { fontSize: 11, color: INK, bold: true },
      h1: { fontSize: 20, bold: true, color: INK, margin: [0, 4, 0, 2] },
      h2: { fontSize: 13, bold: true, color: INK, margin: [0, 12, 0, 4] },
      h3: { fontSize: 11, bold: true, margin: [0, 0, 0, 2] },
      small: { fontSize: 8.5, color: '#555' },
    },
    footer: (page: number, pages: number) => ({ text: `${view.firm.name} · ${view.title} · page ${page} of ${pages}`, style: 'small', alignment: 'center', margin: [0, 16, 0, 0] }),
    content: [
      ...header,
      { text: view.firm.name, style: 'firm' },
      { text: view.title, style: 'h1' },
      { text: [view.project.name, view.project.clientName, view.project.siteAddress].filter((x) => x).join(' · '), style: 'small' },
      { text: 'The house', style: 'h2' },
      { text: view.building },
      { text: 'The climate', style: 'h2' },
      ...view.climate.map((t) => ({ text: t, margin: [0, 0, 0, 4] })),
      { text: 'The options', style: 'h2' },
      { columns: optionBlocks, columnGap: 14 },
      ...view.options.flatMap((o) => [o.sentence, ...o.odds].map((text) => ({ text, margin: [0, 2, 0, 4] }))),
      { stack: [{ text: 'Cost against cold hours', style: 'h2' }, { svg: reportChartSvg(view), width: 515 }], unbreakable: true },
      ...(view.note ? [{ text: 'From your contractor', style: 'h2' }, { text: view.note }] : []),
      { text: SIZING_CAUTIONS_TITLE, style: 'h2', color: EMBER_TEXT },
      { ul: view.cautions, fontSize: 9.5 },
      { text: `Prepared ${view.preparedAt.slice(0, 10)}. ${view.provenance}`, style: 'small', margin: [0, 12, 0, 0] },
    ],
  };
  return printer().createPdf(doc).getBuffer();
}
