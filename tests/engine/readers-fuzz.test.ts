/**
 * The weather-file and equipment-CSV readers on hostile text (fast-check): any input is either read
 * or refused with a clear 4xx-style answer; nothing throws anything else, and nothing takes long.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { parseEquipmentCsv } from '../../shared/equipment/equipment-csv';
import { HttpError } from '../../server/http/http-error';
import { readWeatherFiles } from '../../server/modules/climate/weather-files';

/** Text that looks partly like the files: headers, numbers, dates, quotes, separators and junk. */
const fileText = fc
  .array(
    fc.oneof(
      fc.constantFrom(
        'time,dry_bulb_c\n',
        'time,dry_bulb_f,wind_speed_ms\n',
        'kind,label,output_w,efficiency,fuel,installed_price,life_years\n',
        '2001 01 01 00   -50   -89 10200   250    30     8     0 -9999\n',
      ),
      fc.constantFrom(
        '2001-01-01T00:00Z',
        '-12.5',
        '9999',
        'NA',
        '"',
        '""',
        ',',
        ';',
        '\t',
        '\r\n',
        '\n',
        'furnace',
        'heat-pump',
        '=cmd',
        '1e308',
        '-0',
      ),
      fc.string({ maxLength: 30 }),
      fc.integer({ min: -1e6, max: 1e6 }).map(String),
    ),
    { maxLength: 80 },
  )
  .map((parts) => parts.join(''));

describe('readers on hostile text', () => {
  it('weather files are read or refused with a 400-class answer', async () => {
    await fc.assert(
      fc.asyncProperty(
        fileText,
        fc.constantFrom<'auto' | 'csv' | 'isd-lite'>('auto', 'csv', 'isd-lite'),
        async (text, format) => {
          try {
            const r = await readWeatherFiles([{ name: 'fuzz.csv', content: Buffer.from(text) }], { format });
            assert.equal(r.series.time.length, r.series.dryBulbC.length);
          } catch (err) {
            assert.ok(err instanceof HttpError, `threw ${String(err)}`);
            assert.ok(err.status >= 400 && err.status < 500);
          }
        },
      ),
      { numRuns: 300 },
    );
  });

  it('equipment CSV is parsed or refused with line-numbered problems, never thrown at', () => {
    fc.assert(
      fc.property(fileText, (text) => {
        const r = parseEquipmentCsv(text);
        if (!r.ok) {
          assert.ok(r.problems.length > 0);
          for (const p of r.problems) assert.equal(typeof p.message, 'string');
        }
      }),
      { numRuns: 300 },
    );
  });
});
