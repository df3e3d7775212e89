import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { computeDesignConditions } from '../../shared/climate/design-conditions';
import {
  designConditionsSchema,
  METHOD_VERSION,
  publishedDesignValuesSchema,
} from '../../shared/climate/design-conditions-schema';
import { randomYears, toSeries } from './series-fixtures';

describe('design conditions schema', () => {
  it('accepts the engine output and its JSON round trip, with exactly the documented keys', () => {
    const r = computeDesignConditions(toSeries(randomYears([2020, 2021], 5)), { elevationM: 100 });
    assert.ok(r.ok);
    const parsed = designConditionsSchema.parse(JSON.parse(JSON.stringify(r.conditions)));
    assert.deepEqual(parsed, r.conditions); // nothing stripped: no undocumented keys
    assert.deepEqual(Object.keys(r.conditions).sort(), [
      'cooling',
      'extremeMin',
      'hdd18',
      'heating',
      'humidification',
      'period',
      'warnings',
      'wind',
    ]);
    assert.deepEqual(Object.keys(parsed.extremeMin.returnPeriod).sort(), ['10', '20', '5', '50']);
    assert.equal(r.methodVersion, METHOD_VERSION);
    assert.match(METHOD_VERSION, /^climate-\d+\.\d+\.\d+$/);
  });

  it('refuses a malformed result', () => {
    assert.equal(designConditionsSchema.safeParse({ heating: { db99_6: -10 } }).success, false);
  });
});

describe('published design values schema', () => {
  const minimal = { source: 'ASHRAE Handbook—Fundamentals 2009, Ch. 14 table', heating: { db99_6: 3.8, db99: 4.9 } };

  it('needs only the heating values and the source', () => {
    // San Francisco Intl AP heating values, ASHRAE Handbook—Fundamentals 2009, Ch. 14 (docs/methods.md#design-definitions) [S]
    assert.ok(publishedDesignValuesSchema.safeParse(minimal).success);
    const full = publishedDesignValuesSchema.safeParse({
      ...minimal,
      elevation: 2,
      humidification: { dp99_6: { dewPoint: -3.7, humidityRatio: 2.8, meanCoincidentDryBulb: 10.7 } },
      wind: {
        coldestMonth: 1,
        coldestMonth1: 11.6,
        coincident99_6: 2.2,
        annual1: 12.8,
        annual2_5: 11.5,
        annual5: 10.6,
      },
      extremeMin: { mean: 1.8, sd: 1.5, returnPeriod: { '5': 0.8, '10': -0.1, '20': -0.9, '50': -1.9 } },
    });
    assert.ok(full.success, JSON.stringify(full.error?.issues));
  });

  it('explains what is missing or out of range', () => {
    const noSource = publishedDesignValuesSchema.safeParse({ heating: minimal.heating });
    assert.ok(!noSource.success);
    assert.ok(noSource.error.issues.some((i) => i.path[0] === 'source' && i.message.includes('source')));

    const noHeating = publishedDesignValuesSchema.safeParse({ source: 'x' });
    assert.ok(!noHeating.success);
    assert.ok(noHeating.error.issues.some((i) => i.path[0] === 'heating'));

    const tooCold = publishedDesignValuesSchema.safeParse({ ...minimal, heating: { db99_6: -95, db99: -30 } });
    assert.ok(!tooCold.success);
    assert.match(tooCold.error.issues[0]?.message ?? '', /at least -90 °C/);

    const badMonth = publishedDesignValuesSchema.safeParse({ ...minimal, wind: { coldestMonth: 13 } });
    assert.ok(!badMonth.success);
    assert.match(badMonth.error.issues[0]?.message ?? '', /1 to 12/);

    const badRh = publishedDesignValuesSchema.safeParse({
      ...minimal,
      humidification: { dp99: { relativeHumidity: 120 } },
    });
    assert.ok(!badRh.success);
  });

  it('refuses a 99.6 % value warmer than the 99 % value and unknown fields', () => {
    const swapped = publishedDesignValuesSchema.safeParse({ ...minimal, heating: { db99_6: 4.9, db99: 3.8 } });
    assert.ok(!swapped.success);
    assert.match(swapped.error.issues[0]?.message ?? '', /cannot be warmer/);
    assert.equal(publishedDesignValuesSchema.safeParse({ ...minimal, colour: 'blue' }).success, false);
  });
});
