/**
 * The report as a PDF (pdfmake with the shipped Source Sans 3 fonts; no network or file access
 * beyond those fonts). The chart is the report chart rendered to SVG by ECharts on the server.
 */
import { createRequire } from 'node:module';
import path from 'node:path';
import * as echarts from 'echarts';
import type { ReportView } from '@shared/reports/report-schemas';
import { optionMarks, reportChartOption } from '@shared/reports/report-chart';

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
  p.addFonts({
    SourceSans: {
      normal: f(400, 'normal'),
      bold: f(700, 'normal'),
      italics: f(400, 'italic'),
      bolditalics: f(700, 'italic'),
    },
  });
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

export async function reportPdf(
  view: ReportView,
  logo: { contentType: string; content: Buffer } | null,
): Promise<Buffer> {
  const header: unknown[] = [];
  if (logo) {
    header.push(
      logo.contentType === 'image/svg+xml'
        ? { svg: logo.content.toString('utf8'), fit: [140, 48], margin: [0, 0, 0, 6] }
        : {
            image: `data:${logo.contentType};base64,${logo.content.toString('base64')}`,
            fit: [140, 48],
            margin: [0, 0, 0, 6],
          },
    );
  }
  // One table with an option per column, so that every figure sits on the same line in each option.
  const cell = (text: string, extra: Record<string, unknown> = {}) => ({ text, fontSize: 9.5, ...extra });
  const firstFigures = view.options[0]?.figures ?? [];
  const optionTable = {
    table: {
      headerRows: 1,
      dontBreakRows: true,
      widths: [110, ...view.options.map(() => '*')],
      body: [
        [cell(''), ...view.options.map((o) => cell(o.heading, { bold: true, fontSize: 10.5, color: INK }))],
        [
          cell('Heating unit', { color: '#555' }),
          ...view.options.map((o) => cell(o.unit, { bold: true, color: EMBER_TEXT })),
        ],
        [
          cell('Heat it gives', { color: '#555' }),
          ...view.options.map((o) => cell(`${o.capacity} at ${o.temperature}`)),
        ],
        ...firstFigures.map((f, k) => [
          cell(f.label, { color: '#555' }),
          ...view.options.map((o) => cell(o.figures[k]?.text ?? '—', { bold: true })),
        ]),
        [cell('In short', { color: '#555' }), ...view.options.map((o) => cell(o.sentence, { fontSize: 9 }))],
      ],
    },
    layout: {
      hLineWidth: (i: number) => (i === 1 ? 1 : 0.5),
      vLineWidth: () => 0,
      hLineColor: () => '#D5DCDA',
      paddingTop: () => 3,
      paddingBottom: () => 3,
    },
    margin: [0, 2, 0, 6],
  };
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
    footer: (page: number, pages: number) => ({
      text: `${view.firm.name} · ${view.title} · page ${page} of ${pages}`,
      style: 'small',
      alignment: 'center',
      margin: [0, 16, 0, 0],
    }),
    content: [
      ...header,
      { text: view.firm.name, style: 'firm' },
      { text: view.title, style: 'h1' },
      { text: [view.project.clientName, view.project.siteAddress].filter((x) => x).join(' · '), style: 'small' },
      {
        text: `Prepared ${view.preparedAt.slice(0, 10)} by ${view.contact.name}. ${view.status}`,
        style: 'small',
        margin: [0, 2, 0, 0],
      },
      { text: 'The house', style: 'h2' },
      { text: view.building },
      { text: 'The climate', style: 'h2' },
      ...view.climate.map((t) => ({ text: t, margin: [0, 0, 0, 4] })),
      { text: 'The options', style: 'h2' },
      optionTable,
      ...view.options.flatMap((o) => o.odds.map((text) => ({ text, margin: [0, 2, 0, 4] }))),
      {
        stack: [
          { text: 'What each size costs, and how often it could fall short', style: 'h2' },
          {
            text: `Left to right: units sized for colder and colder nights. The green line is the total cost over the years compared (from zero); the blue area is the hours a year the house could get cooler than you set it. ${optionMarks(view.options.length)}`,
            style: 'small',
            margin: [0, 0, 0, 4],
          },
          { svg: reportChartSvg(view), width: 515 },
        ],
        unbreakable: true,
      },
      ...(view.note ? [{ text: 'From your contractor', style: 'h2' }, { text: view.note }] : []),
      {
        stack: [
          { text: 'Questions?', style: 'h2' },
          {
            text: [
              `Contact ${view.contact.name} at ${view.firm.name}`,
              view.contact.email ? `: ${view.contact.email}` : '',
              view.contact.phone ? ` · ${view.contact.phone}` : '',
            ].join(''),
          },
        ],
        unbreakable: true,
      },
      // The cautions and the provenance line stay together, so no line is left alone on a last page.
      {
        stack: [
          { text: view.cautionsTitle, style: 'h2', color: EMBER_TEXT },
          { ul: view.cautions, fontSize: 9.5 },
          { text: view.provenance, style: 'small', margin: [0, 12, 0, 0] },
        ],
        unbreakable: true,
      },
    ],
  };
  return printer().createPdf(doc).getBuffer();
}
