import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import {
  createCsvParser,
  createIsdLiteParser,
  detectFormat,
  inspectCsvHeader,
  parseIsoDateTime,
  parseWeatherText,
  type LineParser,
  type ParseResult,
} from '../../shared/climate/readers/index';
import { assertClose } from './close-to';

function feed(parser: LineParser, text: string): ParseResult {
  text.split('\n').forEach((line, i) => {
    parser.push(line, i + 1);
  });
  return parser.finish();
}

const csv = (text: string, mapping?: Record<string, string>) => feed(createCsvParser(mapping ? { mapping } : {}), text);
const isd = (text: string) => feed(createIsdLiteParser(), text);

function single(result: ParseResult): { line: number; message: string } {
  assert.equal(result.ok, false, 'the file must be refused');
  assert.ok(!result.ok);
  assert.equal(result.problems.length, 1, `exactly one problem expected, got ${JSON.stringify(result.problems)}`);
  return result.problems[0]!;
}

describe('ISD-Lite reader', () => {
  it('reads the format check line', () => {
    // NOAA NCEI ISD-Lite format (values ×10, −9999 missing), check line docs/methods.md#weather-files, #check-values [C]
    const r = isd('2020 01 15 06   -56  -112 10213   270    46     7     0 -9999\n');
    assert.ok(r.ok);
    assert.equal(r.rowCount, 1);
    assert.equal(r.series.time[0], Date.UTC(2020, 0, 15, 6));
    assert.equal(r.series.dryBulbC[0], -5.6);
    assert.equal(r.series.dewPointC[0], -11.2);
    assert.equal(r.series.windSpeedMs[0], 4.6);
    assert.ok(Number.isNaN(r.series.stationPressureKpa[0]));
  });

  it('turns −9999 into missing values and accepts concatenated yearly files', () => {
    const text = [
      '2019 12 31 23    12 -9999 -9999 -9999 -9999 -9999 -9999 -9999',
      '2019 12 31 22    15    10 10100   180    21     3     0     0',
      '2020 01 01 00 -9999 -9999 -9999 -9999    30 -9999 -9999 -9999',
      '2020 01 01 01   -10   -20 10100   180    21     3     0     0',
    ].join('\n');
    const r = isd(text);
    assert.ok(r.ok);
    assert.equal(r.rowCount, 4);
    assert.equal(r.series.dryBulbC[0], 1.2);
    assert.ok(Number.isNaN(r.series.dewPointC[0]));
    assert.ok(Number.isNaN(r.series.windSpeedMs[0]));
    assert.ok(Number.isNaN(r.series.dryBulbC[2]));
    assert.equal(r.series.windSpeedMs[2], 3);
    assert.equal(r.series.time[3], Date.UTC(2020, 0, 1, 1));
  });

  it('refuses a file with a wrong field count, naming the line', () => {
    const p = single(
      isd(
        '2020 01 15 06   -56  -112 10213   270    46     7     0 -9999\n2020 01 15 07   -56  -112 10213   270    46     7     0\n',
      ),
    );
    assert.equal(p.line, 2);
    assert.match(p.message, /Expected 12 fields, found 11/);
  });

  it('refuses text where a number should be', () => {
    const p = single(
      isd(
        '2020 01 15 06   -56  -112 10213   270    46     7     0 -9999\n\n2020 01 15 07   -5x  -112 10213   270    46     7     0 -9999',
      ),
    );
    assert.equal(p.line, 3);
    assert.match(p.message, /air temperature/);
  });

  it('refuses an impossible date', () => {
    const p = single(isd('2021 02 29 06   -56  -112 10213   270    46     7     0 -9999'));
    assert.equal(p.line, 1);
    assert.match(p.message, /date/);
  });

  it('refuses an empty file', () => {
    assert.match(single(isd('\n\n')).message, /empty/);
  });
});

describe('generic CSV reader', () => {
  it('reads the documented time forms (UTC unless an offset is given)', () => {
    const r = csv(
      [
        'time,dry_bulb_c',
        '2020-01-15T06:00,1',
        '2020-01-15 07:00,2',
        '2020-01-15T08:00Z,3',
        '2020-01-15T10:00+01:00,4',
        '2020-01-15T04:30-05:30,5',
        '2020-01-15T11:00:00.000Z,6',
      ].join('\n'),
    );
    assert.ok(r.ok);
    assert.deepEqual(Array.from(r.series.time), [
      Date.UTC(2020, 0, 15, 6),
      Date.UTC(2020, 0, 15, 7),
      Date.UTC(2020, 0, 15, 8),
      Date.UTC(2020, 0, 15, 9),
      Date.UTC(2020, 0, 15, 10),
      Date.UTC(2020, 0, 15, 11),
    ]);
    assert.equal(parseIsoDateTime('2020-13-01T00:00'), undefined);
    assert.equal(parseIsoDateTime('15/01/2020 06:00'), undefined);
  });

  it('converts °F, mph and knots with exact factors', () => {
    // °F → °C exact; 1 mph = 0.44704 m/s exact; 1 kn = 1852/3600 m/s exact (definitions of the units)
    const f = csv('time,dry_bulb_f,dew_point_f,wind_speed_mph\n2020-01-01T00:00,32,-40,10\n2020-01-01T01:00,212,14,0');
    assert.ok(f.ok);
    assert.deepEqual(Array.from(f.series.dryBulbC), [0, 100]);
    assert.equal(f.series.dewPointC[0], -40);
    assertClose(f.series.dewPointC[1], -10, 1e-12, '14 °F');
    assertClose(f.series.windSpeedMs[0], 4.4704, 1e-12, '10 mph');
    const k = csv('time,dry_bulb_c,wind_speed_kn\n2020-01-01T00:00,5,10');
    assert.ok(k.ok);
    assertClose(k.series.windSpeedMs[0], 18520 / 3600, 1e-12, '10 kn');
  });

  it('treats empty cells, NA and −9999 as missing; tolerates quotes, a BOM and CRLF', () => {
    const text =
      '\uFEFF"time","dry_bulb_c","dew_point_c","wind_speed_ms","station_pressure_kpa","note"\r\n' +
      '"2020-01-01T00:00",1.5,,NA,-9999,"a, quoted ""note"""\r\n' +
      '2020-01-01T01:00,-9999,-3,2,98.1,plain\r\n';
    const r = csv(text);
    assert.ok(r.ok, JSON.stringify(r));
    assert.equal(r.rowCount, 2);
    assert.equal(r.series.dryBulbC[0], 1.5);
    assert.ok(Number.isNaN(r.series.dewPointC[0]));
    assert.ok(Number.isNaN(r.series.windSpeedMs[0]));
    assert.ok(Number.isNaN(r.series.stationPressureKpa[0]));
    assert.ok(Number.isNaN(r.series.dryBulbC[1]));
    assert.equal(r.series.stationPressureKpa[1], 98.1);
  });

  it('does not refuse physically impossible values (the quality report counts them)', () => {
    const r = csv('time,dry_bulb_c\n2020-01-01T00:00,75\n2020-01-01T01:00,-120');
    assert.ok(r.ok);
    assert.deepEqual(Array.from(r.series.dryBulbC), [75, -120]);
  });

  it('refuses a wrong column count, naming the line', () => {
    const p = single(
      csv('time,dry_bulb_c,dew_point_c\n2020-01-01T00:00,1,0\n2020-01-01T01:00,1\n2020-01-01T02:00,1,0'),
    );
    assert.equal(p.line, 3);
    assert.match(p.message, /Expected 3 columns, found 2/);
  });

  it('refuses an unparseable time', () => {
    const p = single(csv('# invented test file\ntime,dry_bulb_c\n2020-01-01T00:00,1\n01/01/2020 01:00,1'));
    assert.equal(p.line, 4);
    assert.match(p.message, /Cannot read the time "01\/01\/2020 01:00"/);
  });

  it('refuses text where a number should be', () => {
    const p = single(csv('time,dry_bulb_c,wind_speed_ms\n2020-01-01T00:00,1,2\n2020-01-01T01:00,1,calm'));
    assert.equal(p.line, 3);
    assert.match(p.message, /wind_speed_ms.*"calm" is not a number/);
  });

  it('refuses a header without a required column', () => {
    const p = single(csv('time,dew_point_c\n2020-01-01T00:00,1'));
    assert.equal(p.line, 1);
    assert.match(p.message, /Missing required column: dry_bulb_c or dry_bulb_f/);
    const q = single(csv('when,dry_bulb_c\n2020-01-01T00:00,1'));
    assert.match(q.message, /Missing required column: time/);
  });

  it('refuses an empty file and a header without rows', () => {
    assert.match(single(csv('')).message, /empty/);
    const p = single(csv('time,dry_bulb_c\n'));
    assert.equal(p.line, 1);
    assert.match(p.message, /no data rows/);
  });

  it('lists the first 10 problems and counts them all', () => {
    const lines = ['time,dry_bulb_c'];
    for (let i = 0; i < 15; i++) lines.push(`2020-01-01T${String(i).padStart(2, '0')}:00,x${i}`);
    const r = csv(lines.join('\n'));
    assert.ok(!r.ok);
    assert.equal(r.problems.length, 10);
    assert.equal(r.problemCount, 15);
    assert.deepEqual(
      r.problems.map((p) => p.line),
      [2, 3, 4, 5, 6, 7, 8, 9, 10, 11],
    );
  });

  it('maps other column names by hand', () => {
    const text = 'Date/Time,Temp,Station\n2020-01-01 00:00,-3.5,X\n2020-01-01 01:00,-4,X';
    const r = csv(text, { time: 'Date/Time', dry_bulb_c: 'Temp' });
    assert.ok(r.ok);
    assert.deepEqual(Array.from(r.series.dryBulbC), [-3.5, -4]);
    const wrong = single(csv(text, { time: 'Date/Time', dry_bulb_c: 'Temperature' }));
    assert.equal(wrong.line, 1);
    assert.match(wrong.message, /"Temperature"/);
  });

  it('inspects a header and suggests a mapping', () => {
    const i = inspectCsvHeader(
      '\uFEFF"Date/Time","Temp (°F)","Dew Point (F)","Wind Speed (mph)","Wind Dir","Pressure (kPa)"',
    );
    assert.deepEqual(i.columns, [
      'Date/Time',
      'Temp (°F)',
      'Dew Point (F)',
      'Wind Speed (mph)',
      'Wind Dir',
      'Pressure (kPa)',
    ]);
    assert.deepEqual(i.suggestedMapping, {
      time: 'Date/Time',
      dry_bulb_f: 'Temp (°F)',
      dew_point_f: 'Dew Point (F)',
      wind_speed_mph: 'Wind Speed (mph)',
      station_pressure_kpa: 'Pressure (kPa)',
    });
    assert.deepEqual(i.missingRequired, []);
    const plain = inspectCsvHeader('time,dry_bulb_c,dew_point_c');
    assert.deepEqual(plain.suggestedMapping, { time: 'time', dry_bulb_c: 'dry_bulb_c', dew_point_c: 'dew_point_c' });
    assert.deepEqual(inspectCsvHeader('station,value').missingRequired, ['time', 'dry_bulb']);
  });
});

describe('format detection', () => {
  it('tells ISD-Lite from CSV', () => {
    assert.equal(detectFormat('2020 01 15 06   -56  -112 10213   270    46     7     0 -9999'), 'isd-lite');
    assert.equal(detectFormat('time,dry_bulb_c'), 'csv');
    const r = parseWeatherText('\n2020 01 15 06   -56  -112 10213   270    46     7     0 -9999\n');
    assert.equal(r.format, 'isd-lite');
    assert.ok(r.ok);
  });
});
