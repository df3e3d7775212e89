/**
 * Equipment lists as CSV (RFC 4180: comma-separated, fields with commas, quotes or line breaks in
 * double quotes, quotes doubled). The header row names the columns, in any order:
 *
 *   kind,label,output_w|output_btuh,input_w,efficiency,fuel,cap_8_3_w,cop_8_3,cap_m8_3_w,cop_m8_3,
 *   cap_m15_w,cop_m15,backup_w,installed_price,life_years
 *
 * and optionally extrapolate, defrost_band (true/false) and cutout_c for heat pumps. Blank cells
 * are absent values. Any bad line refuses the whole file, with every problem and its line number.
 * `toCsv` writes SI columns (output_w) and round-trips through `parseEquipmentCsv`.
 */
import type { z } from 'zod';
import { toSi } from '../units/units';
import { csvTextField, unguardCsvText } from '../csv/csv-field';
import { equipmentOptionSchema, type EquipmentOption } from './equipment-schemas';

export interface CsvProblem {
  /** 1-based line of the file (the header is line 1; a record spanning lines counts from its first). */
  line: number;
  message: string;
}

export type EquipmentCsvResult = { ok: true; options: EquipmentOption[] } | { ok: false; problems: CsvProblem[] };

/** The columns `toCsv` writes, in order. */
export const EQUIPMENT_CSV_COLUMNS = [
  'kind',
  'label',
  'output_w',
  'input_w',
  'efficiency',
  'fuel',
  'cap_8_3_w',
  'cop_8_3',
  'cap_m8_3_w',
  'cop_m8_3',
  'cap_m15_w',
  'cop_m15',
  'backup_w',
  'installed_price',
  'life_years',
] as const;

/** Heat-pump columns written only when an option departs from the defaults. */
export const EQUIPMENT_CSV_EXTRA_COLUMNS = ['extrapolate', 'defrost_band', 'cutout_c'] as const;

const KNOWN_COLUMNS: ReadonlySet<string> = new Set<string>([
  ...EQUIPMENT_CSV_COLUMNS,
  'output_btuh',
  ...EQUIPMENT_CSV_EXTRA_COLUMNS,
]);
const REQUIRED_COLUMNS = ['kind', 'label', 'installed_price', 'life_years'] as const;

/** Option field → CSV column, for problem messages. */
const COLUMN_OF_FIELD: Readonly<Record<string, string>> = {
  kind: 'kind',
  label: 'label',
  outputW: 'output_w',
  inputW: 'input_w',
  efficiency: 'efficiency',
  fuel: 'fuel',
  capacity8_3W: 'cap_8_3_w',
  cop8_3: 'cop_8_3',
  capacityM8_3W: 'cap_m8_3_w',
  copM8_3: 'cop_m8_3',
  capacityM15W: 'cap_m15_w',
  copM15: 'cop_m15',
  backupW: 'backup_w',
  installedPrice: 'installed_price',
  lifeYears: 'life_years',
  extrapolate: 'extrapolate',
  defrostBand: 'defrost_band',
  cutoutC: 'cutout_c',
};

interface CsvRecord {
  line: number;
  fields: string[];
}

/** Splits CSV text into records (RFC 4180), skipping blank lines. Throws on an unterminated quote. */
export function parseCsvRecords(text: string): CsvRecord[] {
  const src = text.startsWith('\uFEFF') ? text.slice(1) : text;
  const records: CsvRecord[] = [];
  let fields: string[] = [];
  let field = '';
  let line = 1;
  let recordLine = 1;
  let quoted = false;
  let fieldStarted = false;
  const endRecord = () => {
    fields.push(field);
    if (!(fields.length === 1 && fields[0] === '' && !fieldStarted)) records.push({ line: recordLine, fields });
    fields = [];
    field = '';
    fieldStarted = false;
  };
  for (let i = 0; i < src.length; i++) {
    const ch = src.charAt(i);
    if (quoted) {
      if (ch === '"') {
        if (src[i + 1] === '"') {
          field += '"';
          i++;
        } else quoted = false;
      } else {
        if (ch === '\n') line++;
        field += ch;
      }
      continue;
    }
    if (ch === '"' && field === '') {
      quoted = true;
      fieldStarted = true;
    } else if (ch === ',') {
      fields.push(field);
      field = '';
      fieldStarted = true;
    } else if (ch === '\n' || ch === '\r') {
      if (ch === '\r' && src[i + 1] === '\n') i++;
      endRecord();
      line++;
      recordLine = line;
    } else {
      field += ch;
      fieldStarted = true;
    }
  }
  if (quoted) throw new SyntaxError(`line ${recordLine}: a quoted field is not closed`);
  if (field !== '' || fields.length > 0 || fieldStarted) endRecord();
  return records;
}

const NUMBER_TEXT = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** Parses an equipment list CSV; any bad line refuses the whole file. */
export function parseEquipmentCsv(text: string): EquipmentCsvResult {
  let records: CsvRecord[];
  try {
    records = parseCsvRecords(text);
  } catch (e) {
    const m = /^line (\d+): (.*)$/.exec(e instanceof Error ? e.message : '');
    return { ok: false, problems: [{ line: Number(m?.[1] ?? 1), message: m?.[2] ?? 'The file is not valid CSV' }] };
  }
  // Spreadsheets often export empty rows as a line of commas: skip them like blank lines.
  const [header, ...rows] = records.filter((r) => r.fields.some((f) => f.trim() !== ''));
  if (!header)
    return {
      ok: false,
      problems: [{ line: 1, message: 'The file is empty: it needs a header row and one row per option' }],
    };

  const columns = header.fields.map((f) => f.trim().toLowerCase());
  const headerProblems: string[] = [];
  const seen = new Set<string>();
  for (const c of columns) {
    if (!KNOWN_COLUMNS.has(c)) headerProblems.push(`unknown column "${c}"`);
    else if (seen.has(c)) headerProblems.push(`column "${c}" appears twice`);
    seen.add(c);
  }
  for (const c of REQUIRED_COLUMNS) if (!seen.has(c)) headerProblems.push(`column "${c}" is missing`);
  if (headerProblems.length > 0) {
    return {
      ok: false,
      problems: [
        {
          line: header.line,
          message: `Header: ${headerProblems.join('; ')}. Known columns: ${[...KNOWN_COLUMNS].join(', ')}`,
        },
      ],
    };
  }
  if (rows.length === 0)
    return { ok: false, problems: [{ line: header.line, message: 'The file has a header but no equipment rows' }] };

  const problems: CsvProblem[] = [];
  const options: EquipmentOption[] = [];
  for (const row of rows) {
    if (row.fields.length !== columns.length) {
      problems.push({ line: row.line, message: `Expected ${columns.length} fields, found ${row.fields.length}` });
      continue;
    }
    const cells = new Map<string, string>();
    columns.forEach((c, i) => {
      const v = (row.fields[i] ?? '').trim();
      if (v !== '') cells.set(c, v);
    });
    const built = buildOption(cells);
    if (built.problems.length > 0) {
      for (const message of built.problems) problems.push({ line: row.line, message });
      continue;
    }
    const parsed = equipmentOptionSchema.safeParse(built.value);
    if (!parsed.success) {
      for (const message of issueMessages(parsed.error.issues)) problems.push({ line: row.line, message });
      continue;
    }
    options.push(parsed.data);
  }
  return problems.length > 0 ? { ok: false, problems } : { ok: true, options };
}

function issueMessages(issues: readonly z.core.$ZodIssue[]): string[] {
  return issues.map((i) => {
    const field = i.path[0];
    const column = typeof field === 'string' ? COLUMN_OF_FIELD[field] : undefined;
    return column ? `${column}: ${i.message}` : i.message;
  });
}

/** Turns the non-blank cells of a row into an object for the schema, reporting unreadable cells. */
function buildOption(cells: ReadonlyMap<string, string>): { value: Record<string, unknown>; problems: string[] } {
  const problems: string[] = [];
  const value: Record<string, unknown> = {};
  const number = (column: string): number | undefined => {
    const text = cells.get(column);
    if (text === undefined) return undefined;
    if (!NUMBER_TEXT.test(text)) {
      problems.push(`${column}: "${text}" is not a number`);
      return undefined;
    }
    return Number(text);
  };
  const boolean = (column: string): boolean | undefined => {
    const text = cells.get(column)?.toLowerCase();
    if (text === undefined) return undefined;
    if (text === 'true' || text === 'yes' || text === '1') return true;
    if (text === 'false' || text === 'no' || text === '0') return false;
    problems.push(`${column}: "${cells.get(column) ?? ''}" is not true or false`);
    return undefined;
  };
  const put = (key: string, v: unknown) => {
    if (v !== undefined) value[key] = v;
  };

  const kind = cells.get('kind')?.toLowerCase();
  put('kind', kind);
  // The apostrophe an export put before text a spreadsheet would run as a formula comes off.
  const label = cells.get('label');
  put('label', label === undefined ? undefined : unguardCsvText(label));
  put('installedPrice', cells.get('installed_price'));
  put('lifeYears', number('life_years'));
  put('fuel', cells.get('fuel')?.toLowerCase());

  const outputW = number('output_w');
  const outputBtuh = number('output_btuh');
  if (outputW !== undefined && outputBtuh !== undefined) problems.push('Fill in output_w or output_btuh, not both');
  put('outputW', outputW ?? (outputBtuh === undefined ? undefined : toSi('power', outputBtuh, 'IP')));
  put('inputW', number('input_w'));
  const efficiency = number('efficiency');

  const heatPumpColumns = [
    ['capacity8_3W', 'cap_8_3_w'],
    ['cop8_3', 'cop_8_3'],
    ['capacityM8_3W', 'cap_m8_3_w'],
    ['copM8_3', 'cop_m8_3'],
    ['capacityM15W', 'cap_m15_w'],
    ['copM15', 'cop_m15'],
    ['backupW', 'backup_w'],
    ['cutoutC', 'cutout_c'],
  ] as const;
  if (kind === 'heat-pump') {
    for (const [key, column] of heatPumpColumns) put(key, number(column));
    put('extrapolate', boolean('extrapolate'));
    put('defrostBand', boolean('defrost_band'));
    // The efficiency column describes combustion or resistance heat; a heat pump's backup is COP 1.
    if (efficiency !== undefined && efficiency !== 1)
      problems.push('efficiency: leave it blank for a heat pump (its COPs are in the cop_ columns)');
  } else {
    put('efficiency', efficiency);
    const stray = [...heatPumpColumns.map(([, c]) => c), 'extrapolate', 'defrost_band'].filter((c) => cells.has(c));
    if (stray.length > 0)
      problems.push(`${stray.join(', ')}: only for heat pumps; leave blank for a ${kind ?? 'non-heat-pump'}`);
  }
  return { value, problems };
}

/** Quotes a CSV field when it needs it (comma, quote, line break, or spaces at either end). */
const num = (v: number | undefined): string => (v === undefined ? '' : String(v));

/** The options as CSV (header + one row each, CRLF line ends), readable by `parseEquipmentCsv`. */
export function toCsv(options: readonly EquipmentOption[]): string {
  const extras = options.some(
    (o) => o.kind === 'heat-pump' && (o.extrapolate || o.defrostBand || o.cutoutC !== undefined),
  );
  const header: string[] = [...EQUIPMENT_CSV_COLUMNS, ...(extras ? EQUIPMENT_CSV_EXTRA_COLUMNS : [])];
  const lines = [header.join(',')];
  for (const o of options) {
    const hp = o.kind === 'heat-pump' ? o : undefined;
    const other = o.kind === 'heat-pump' ? undefined : o;
    const row = [
      o.kind,
      csvTextField(o.label),
      num(other?.outputW),
      num(other?.inputW),
      num(other?.efficiency),
      o.fuel,
      num(hp?.capacity8_3W),
      num(hp?.cop8_3),
      num(hp?.capacityM8_3W),
      num(hp?.copM8_3),
      num(hp?.capacityM15W),
      num(hp?.copM15),
      num(hp?.backupW),
      o.installedPrice,
      String(o.lifeYears),
    ];
    if (extras) {
      row.push(hp ? String(hp.extrapolate) : '', hp ? String(hp.defrostBand) : '', num(hp?.cutoutC));
    }
    lines.push(row.join(','));
  }
  return lines.join('\r\n') + '\r\n';
}
