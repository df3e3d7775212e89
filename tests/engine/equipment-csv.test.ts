/**
 * Equipment list CSV (RFC 4180 quoting): import with line-numbered problems (any bad line refuses
 * the file) and export that round-trips. Btu/h → W uses 1 Btu_IT/h = 0.2930711 W
 * (NIST SP 811 (2008), App. B.8 [S, secondary]).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { parseCsvRecords, parseEquipmentCsv, toCsv } from '../../shared/equipment/equipment-csv';
import { equipmentOptionSchema, type EquipmentOption } from '../../shared/equipment/equipment-schemas';
import { assertClose } from './close-to';

const HEADER =
  'kind,label,output_w,input_w,efficiency,fuel,cap_8_3_w,cop_8_3,cap_m8_3_w,cop_m8_3,cap_m15_w,cop_m15,backup_w,installed_price,life_years';

const GOOD = [
  HEADER,
  'furnace,"Condensing furnace, 60k",,17584,0.96,gas,,,,,,,,4850.00,20',
  'boiler,Oil boiler,24000,,0.86,oil,,,,,,,,9100,25',
  'heat-pump,"Cold-climate ""3 ton"" split",,,,electricity,10500,3.6,7900,2.4,6800,1.9,5000,12400.50,15',
  'heat-pump,Ducted 2-ton,,,,,7000,3.4,4300,2.2,,,,8300,15',
  'electric,Baseboard,9000,,1,electricity,,,,,,,,1500,30',
].join('\n');

describe('equipment CSV import', () => {
  it('reads a good file, with quoted labels, blank cells and kinds', () => {
    const r = parseEquipmentCsv(GOOD);
    assert.ok(r.ok, JSON.stringify(!r.ok && r.problems));
    assert.equal(r.options.length, 5);
    const [furnace, boiler, hp, hp2, heater] = r.options;
    assert.equal(furnace?.label, 'Condensing furnace, 60k');
    assert.equal(furnace?.kind === 'furnace' && furnace.inputW, 17584);
    assert.equal(boiler?.kind === 'boiler' && boiler.fuel, 'oil');
    assert.equal(hp?.label, 'Cold-climate "3 ton" split');
    assert.ok(hp?.kind === 'heat-pump');
    assert.equal(hp.capacityM15W, 6800);
    assert.equal(hp.backupW, 5000);
    assert.equal(hp.installedPrice, '12400.50');
    assert.ok(hp2?.kind === 'heat-pump');
    assert.equal(hp2.fuel, 'electricity'); // a heat pump's fuel may be left blank
    assert.equal(hp2.backupW, 0);
    assert.equal(hp2.capacityM15W, undefined);
    assert.equal(heater?.kind === 'electric' && heater.outputW, 9000);
  });

  it('accepts columns in any order, output in Btu/h, CRLF line ends, a BOM and blank lines', () => {
    const text =
      '\uFEFFlabel,kind,fuel,efficiency,output_btuh,installed_price,life_years\r\n\r\nGas furnace 80k,furnace,gas,0.95,76000,5200,20\r\n,,,,,,\r\n';
    const r = parseEquipmentCsv(text);
    assert.ok(r.ok, JSON.stringify(!r.ok && r.problems));
    const [f] = r.options;
    assert.ok(f?.kind === 'furnace');
    assertClose(f.outputW, 76_000 * 0.2930711, 0.01, 'W'); // 22 273.4 W (docs/methods.md#combustion-output: 22.27 kW)
  });

  it('refuses the whole file when any line is bad, naming each line', () => {
    const text = [
      HEADER,
      'furnace,Good one,20000,,0.95,gas,,,,,,,,4000,20', // line 2: fine
      'furnace,No rating,,,0.95,gas,,,,,,,,4000,20', // line 3: neither output nor input
      'heat-pump,HP,,,,electricity,10000,abc,6000,2.3,,,,9000,15', // line 4: not a number
      'boiler,Too few fields,20000', // line 5
      'electric,Cheap,5000,,1,electricity,,,,,,,,"1,500",30', // line 6: price with a comma
      'stove,Wood,10000,,0.7,wood,,,,,,,,3000,20', // line 7: unknown kind
    ].join('\n');
    const r = parseEquipmentCsv(text);
    assert.ok(!r.ok);
    const lines = [...new Set(r.problems.map((p) => p.line))];
    assert.deepEqual(lines, [3, 4, 5, 6, 7]);
    const at = (line: number) =>
      r.problems
        .filter((p) => p.line === line)
        .map((p) => p.message)
        .join(' | ');
    assert.match(at(3), /output_w: Enter the rated output or the rated input/);
    assert.match(at(4), /cop_8_3: "abc" is not a number/);
    assert.match(at(5), /Expected 15 fields, found 3/);
    assert.match(at(6), /installed_price: Enter an amount such as 1234\.50/);
    assert.match(at(7), /furnace, boiler, heat-pump or electric/);
  });

  it('counts lines inside quoted line breaks', () => {
    const text = `${HEADER}\nfurnace,"Two\nline label",20000,,0.95,gas,,,,,,,,4000,20\nfurnace,Bad,20000,,1.5,gas,,,,,,,,4000,20\n`;
    const r = parseEquipmentCsv(text);
    assert.ok(!r.ok);
    assert.deepEqual(
      r.problems.map((p) => p.line),
      [4],
    );
    assert.match(r.problems[0]?.message ?? '', /efficiency: The efficiency must be at most 1/);
  });

  it('refuses bad headers, stray heat-pump columns, an empty file and an unclosed quote', () => {
    const unknown = parseEquipmentCsv('kind,label,price,life_years\nfurnace,x,1,1');
    assert.ok(!unknown.ok);
    assert.equal(unknown.problems[0]?.line, 1);
    assert.match(unknown.problems[0]?.message ?? '', /unknown column "price".*column "installed_price" is missing/);
    const stray = parseEquipmentCsv(`${HEADER}\nfurnace,F,20000,,0.95,gas,9000,,,,,,,4000,20`);
    assert.ok(!stray.ok);
    assert.match(stray.problems[0]?.message ?? '', /cap_8_3_w: only for heat pumps/);
    const empty = parseEquipmentCsv('');
    assert.ok(!empty.ok);
    assert.match(empty.problems[0]?.message ?? '', /empty/);
    const headerOnly = parseEquipmentCsv(HEADER);
    assert.ok(!headerOnly.ok);
    const unclosed = parseEquipmentCsv(`${HEADER}\nfurnace,"Open,20000`);
    assert.ok(!unclosed.ok);
    assert.deepEqual(unclosed.problems, [{ line: 2, message: 'a quoted field is not closed' }]);
  });

  it('splits records by RFC 4180 rules', () => {
    assert.deepEqual(parseCsvRecords('a,"b,c","d""e"\r\n\r\n,x,\n'), [
      { line: 1, fields: ['a', 'b,c', 'd"e'] },
      { line: 3, fields: ['', 'x', ''] },
    ]);
  });
});

describe('equipment CSV export', () => {
  it('a good file round-trips through toCsv', () => {
    const first = parseEquipmentCsv(GOOD);
    assert.ok(first.ok);
    const csv = toCsv(first.options);
    assert.equal(csv.split('\r\n')[0], HEADER);
    const again = parseEquipmentCsv(csv);
    assert.ok(again.ok, JSON.stringify(!again.ok && again.problems));
    assert.deepEqual(again.options, first.options);
    assert.equal(toCsv(again.options), csv);
  });

  it('guards labels that a spreadsheet would run as formulas, and reads them back unchanged', () => {
    // OWASP "CSV Injection": cells starting with =, +, -, @ get a leading apostrophe on export.
    const labels = ['=HYPERLINK("http://x.test")', '+1 furnace', '-cmd', '@SUM(A1)', 'Plain furnace'];
    const options = labels.map((label) =>
      equipmentOptionSchema.parse({
        kind: 'furnace',
        label,
        fuel: 'gas',
        efficiency: 0.95,
        outputW: 9000,
        installedPrice: '3000.00',
        lifeYears: 20,
      }),
    );
    const csv = toCsv(options);
    const cells = csv
      .split('\r\n')
      .slice(1, -1)
      .map((line) => line.split(',')[1] ?? '');
    assert.ok(cells[0]?.startsWith('"\'='), cells[0]);
    assert.equal(cells[1], "'+1 furnace");
    assert.equal(cells[2], "'-cmd");
    assert.equal(cells[3], "'@SUM(A1)");
    assert.equal(cells[4], 'Plain furnace');
    const back = parseEquipmentCsv(csv);
    assert.ok(back.ok);
    assert.deepEqual(
      back.options.map((o) => o.label),
      labels,
    );
  });

  it('keeps the heat-pump settings in extra columns when they are used', () => {
    const options: EquipmentOption[] = [
      equipmentOptionSchema.parse({
        kind: 'heat-pump',
        label: ' padded, "quoted" ',
        capacity8_3W: 9000,
        cop8_3: 3.3,
        capacityM8_3W: 5500,
        copM8_3: 2.1,
        extrapolate: true,
        cutoutC: -25,
        installedPrice: '7000',
        lifeYears: 12,
      }),
    ];
    const csv = toCsv(options);
    assert.match(csv.split('\r\n')[0] ?? '', /,extrapolate,defrost_band,cutout_c$/);
    const back = parseEquipmentCsv(csv);
    assert.ok(back.ok, JSON.stringify(!back.ok && back.problems));
    assert.deepEqual(back.options, options);
    assert.equal(back.options[0]?.label, 'padded, "quoted"'); // the schema trims labels
  });

  it('property: any list of valid options round-trips', () => {
    const label = fc.string({ minLength: 1, maxLength: 20 }).filter((s) => s.trim() === s && s.trim() !== '');
    const price = fc
      .tuple(fc.integer({ min: 0, max: 99_999 }), fc.integer({ min: 0, max: 99 }))
      .map(([a, b]) => `${a}.${String(b).padStart(2, '0')}`);
    const w = fc.double({ min: 100, max: 100_000, noNaN: true });
    const cop = fc.double({ min: 1, max: 6, noNaN: true });
    const fuelled = fc.record({
      kind: fc.constantFrom('furnace' as const, 'boiler' as const),
      label,
      fuel: fc.constantFrom('gas' as const, 'oil' as const, 'propane' as const),
      efficiency: fc.double({ min: 0.5, max: 1, noNaN: true }),
      outputW: w,
      installedPrice: price,
      lifeYears: fc.integer({ min: 1, max: 40 }),
    });
    const hp = fc.record({
      kind: fc.constant('heat-pump' as const),
      label,
      capacity8_3W: w,
      cop8_3: cop,
      capacityM8_3W: w,
      copM8_3: cop,
      backupW: fc.constantFrom(0, 5000, 10_000),
      defrostBand: fc.boolean(),
      installedPrice: price,
      lifeYears: fc.integer({ min: 1, max: 40 }),
    });
    fc.assert(
      fc.property(fc.array(fc.oneof(fuelled, hp), { minLength: 1, maxLength: 8 }), (raw) => {
        const options = raw.map((o) => equipmentOptionSchema.parse(o));
        const back = parseEquipmentCsv(toCsv(options));
        assert.ok(back.ok, JSON.stringify(!back.ok && back.problems));
        assert.deepEqual(back.options, options);
      }),
    );
  });
});
