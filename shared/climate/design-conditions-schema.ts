/**
 * The JSON shape of a set of outdoor design conditions (computed by the engine, printed by the
 * command line, stored by the server) and of values typed in by hand from a published table.
 * Units: °C, m/s, g/kg, %, °C·day.
 */
import { z } from 'zod';

/** Version of the calculation method; stored beside every computed result. */
export const METHOD_VERSION = 'climate-1.0.0';

/** Machine codes of the warnings a computed result can carry. */
export const designWarningCodes = [
  'short-record',
  'years-dropped',
  'duplicate-hours',
  'out-of-range-values',
  'invalid-times',
  'missing-dew-point',
  'missing-wind',
  'single-year-extremes',
  'no-coincident-hours',
  'pressure-assumed-sea-level',
] as const;
export const designWarningCodeSchema = z.enum(designWarningCodes);
export type DesignWarningCode = z.infer<typeof designWarningCodeSchema>;

/** Humidification design values at one percentile. */
export const humidificationValuesSchema = z.object({
  /** Design dew point, °C. */
  dewPoint: z.number(),
  /** Humidity ratio at the design dew point and the station pressure, g/kg. */
  humidityRatio: z.number(),
  /** Mean dry-bulb of the hours whose dew point is within ±0.5 K of the design dew point, °C (null: no such hour). */
  meanCoincidentDryBulb: z.number().nullable(),
  /** Relative humidity of that humidity ratio at the mean coincident dry-bulb, % (null with it). */
  relativeHumidity: z.number().nullable(),
});
export type HumidificationValues = z.infer<typeof humidificationValuesSchema>;

export const designConditionsSchema = z.object({
  period: z.object({
    /** First and last calendar year (UTC) found in the record. */
    firstYear: z.int(),
    lastYear: z.int(),
    /** The years that met the completeness rule and entered the statistics. */
    qualifyingYears: z.array(z.int()),
    /** Valid hourly dry-bulb values of the qualifying years. */
    validHours: z.int().nonnegative(),
  }),
  heating: z.object({ db99_6: z.number(), db99: z.number() }),
  cooling: z.object({ db0_4: z.number(), db1: z.number(), db2: z.number() }),
  extremeMin: z.object({
    /** Mean of the yearly minimum dry-bulbs, °C. */
    mean: z.number(),
    /** Sample standard deviation (n − 1) of the yearly minima, K; null with a single year. */
    sd: z.number().nullable(),
    /** n-year return-period minimum dry-bulb, °C; null with a single year. */
    returnPeriod: z.object({
      '5': z.number().nullable(),
      '10': z.number().nullable(),
      '20': z.number().nullable(),
      '50': z.number().nullable(),
    }),
  }),
  humidification: z.object({
    dp99_6: humidificationValuesSchema.nullable(),
    dp99: humidificationValuesSchema.nullable(),
  }),
  wind: z.object({
    /** Calendar month (1–12) with the lowest mean dry-bulb. */
    coldestMonth: z.int().min(1).max(12),
    /** Wind speed exceeded by 1 % of the coldest month's hours, m/s. */
    coldestMonth1: z.number().nullable(),
    /** Mean wind speed of the hours at or below the 99.6 % heating dry-bulb, m/s. */
    coincident99_6: z.number().nullable(),
    /** Wind speeds exceeded by 1 %, 2.5 % and 5 % of all hours, m/s. */
    annual1: z.number().nullable(),
    annual2_5: z.number().nullable(),
    annual5: z.number().nullable(),
  }),
  /** Heating degree-days, base 18.3 °C, per average qualifying year, °C·day. */
  hdd18: z.number(),
  /** Machine codes (see `designWarningCodes`). */
  warnings: z.array(z.string()),
});
export type DesignConditions = z.infer<typeof designConditionsSchema>;

// ---------------------------------------------------------------------------------------------
// Values typed in by hand from a published table

const TEMPERATURE_MIN_C = -90;
const TEMPERATURE_MAX_C = 60;

const temperature = (label: string) =>
  z
    .number({ error: `Enter the ${label} as a number (°C)` })
    .min(TEMPERATURE_MIN_C, `The ${label} must be at least ${TEMPERATURE_MIN_C} °C`)
    .max(TEMPERATURE_MAX_C, `The ${label} must be at most ${TEMPERATURE_MAX_C} °C`);

const windSpeed = (label: string) =>
  z
    .number({ error: `Enter the ${label} as a number (m/s)` })
    .min(0, `The ${label} cannot be negative`)
    .max(75, `The ${label} must be at most 75 m/s`);

const year = (label: string) =>
  z
    .int({ error: `Enter the ${label} as a whole year` })
    .min(1850, `The ${label} must be 1850 or later`)
    .max(2200, `The ${label} must be 2200 or earlier`);

const publishedHumidificationSchema = z.strictObject({
  dewPoint: temperature('design dew point').optional(),
  humidityRatio: z
    .number({ error: 'Enter the humidity ratio as a number (g/kg)' })
    .min(0, 'The humidity ratio cannot be negative')
    .max(100, 'The humidity ratio must be at most 100 g/kg')
    .optional(),
  meanCoincidentDryBulb: temperature('mean coincident dry-bulb').optional(),
  relativeHumidity: z
    .number({ error: 'Enter the relative humidity as a number (%)' })
    .min(0, 'The relative humidity cannot be negative')
    .max(100, 'The relative humidity must be at most 100 %')
    .optional(),
});

/** Design values copied by hand from a published table (heating values and the source are required). */
export const publishedDesignValuesSchema = z
  .strictObject({
    /** Where the values come from, e.g. "ASHRAE Handbook—Fundamentals 2021, Ch. 14 table". */
    source: z
      .string({ error: 'Name the source of these values' })
      .trim()
      .min(1, 'Name the source of these values')
      .max(500, 'Use at most 500 characters for the source'),
    /** Site elevation, m. */
    elevation: z
      .number({ error: 'Enter the elevation as a number (m)' })
      .min(-500, 'The elevation must be at least −500 m')
      .max(9000, 'The elevation must be at most 9000 m')
      .optional(),
    period: z
      .strictObject({ firstYear: year('first year').optional(), lastYear: year('last year').optional() })
      .optional(),
    heating: z.strictObject(
      {
        db99_6: temperature('99.6 % heating dry-bulb'),
        db99: temperature('99 % heating dry-bulb'),
      },
      { error: 'Enter the 99.6 % and 99 % heating dry-bulb temperatures' },
    ),
    cooling: z
      .strictObject({
        db0_4: temperature('0.4 % cooling dry-bulb').optional(),
        db1: temperature('1 % cooling dry-bulb').optional(),
        db2: temperature('2 % cooling dry-bulb').optional(),
      })
      .optional(),
    extremeMin: z
      .strictObject({
        mean: temperature('mean extreme minimum').optional(),
        sd: z
          .number({ error: 'Enter the standard deviation as a number (K)' })
          .min(0, 'The standard deviation cannot be negative')
          .max(30, 'The standard deviation must be at most 30 K')
          .optional(),
        returnPeriod: z
          .strictObject({
            '5': temperature('5-year minimum').optional(),
            '10': temperature('10-year minimum').optional(),
            '20': temperature('20-year minimum').optional(),
            '50': temperature('50-year minimum').optional(),
          })
          .optional(),
      })
      .optional(),
    humidification: z
      .strictObject({
        dp99_6: publishedHumidificationSchema.optional(),
        dp99: publishedHumidificationSchema.optional(),
      })
      .optional(),
    wind: z
      .strictObject({
        coldestMonth: z
          .int({ error: 'Enter the coldest month as a number from 1 to 12' })
          .min(1, 'The coldest month must be from 1 to 12')
          .max(12, 'The coldest month must be from 1 to 12')
          .optional(),
        coldestMonth1: windSpeed('coldest-month 1 % wind speed').optional(),
        coincident99_6: windSpeed('mean coincident wind speed').optional(),
        annual1: windSpeed('1 % wind speed').optional(),
        annual2_5: windSpeed('2.5 % wind speed').optional(),
        annual5: windSpeed('5 % wind speed').optional(),
      })
      .optional(),
    hdd18: z
      .number({ error: 'Enter the heating degree-days as a number (°C·day)' })
      .min(0, 'Heating degree-days cannot be negative')
      .max(20000, 'Heating degree-days must be at most 20 000 °C·day')
      .optional(),
  })
  .refine((v) => v.heating.db99_6 <= v.heating.db99, {
    path: ['heating', 'db99_6'],
    error: 'The 99.6 % heating dry-bulb cannot be warmer than the 99 % value',
  })
  .refine(
    (v) =>
      v.period?.firstYear === undefined || v.period.lastYear === undefined || v.period.firstYear <= v.period.lastYear,
    {
      path: ['period', 'lastYear'],
      error: 'The last year cannot be before the first year',
    },
  );
export type PublishedDesignValues = z.infer<typeof publishedDesignValuesSchema>;
