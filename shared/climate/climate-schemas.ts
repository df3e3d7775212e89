import { z } from 'zod';
import { designConditionsSchema, publishedDesignValuesSchema } from './design-conditions-schema';

export const CLIMATE_SITE_NAME_MAX = 160;
/** Largest accepted upload, bytes (60 MB). */
export const CLIMATE_UPLOAD_MAX_BYTES = 60 * 1024 * 1024;
/** ISD-Lite comes one file per station-year: an upload may hold this many files. */
export const CLIMATE_UPLOAD_MAX_FILES = 60;

export const sourceKinds = ['published', 'hourly'] as const;
export const sourceKindSchema = z.enum(sourceKinds, { error: 'Choose published values or an hourly record' });
export type SourceKind = z.infer<typeof sourceKindSchema>;

const optionalNumber = (label: string, min: number, max: number, unit: string) =>
  z
    .number({ error: `Enter the ${label} as a number (${unit})` })
    .min(min, `The ${label} must be at least ${min} ${unit}`)
    .max(max, `The ${label} must be at most ${max} ${unit}`)
    .nullable()
    .optional();

const siteFields = {
  name: z
    .string({ error: 'Enter a name for the site' })
    .trim()
    .min(1, 'Enter a name for the site')
    .max(CLIMATE_SITE_NAME_MAX, `Use at most ${CLIMATE_SITE_NAME_MAX} characters`),
  latitude: optionalNumber('latitude', -90, 90, '°'),
  longitude: optionalNumber('longitude', -180, 180, '°'),
  /** Site elevation, m; sets the station pressure by the standard atmosphere. */
  elevationM: optionalNumber('elevation', -500, 9000, 'm'),
  /** Local standard time minus UTC, hours (for display only: the engine works in UTC). */
  utcOffsetHours: optionalNumber('UTC offset', -12, 14, 'h'),
  notes: z.string().trim().max(4000, 'Use at most 4000 characters for notes').optional(),
};

/** POST /api/v1/climate-sites */
export const climateSiteInputSchema = z
  .strictObject({
    ...siteFields,
    sourceKind: sourceKindSchema,
    /** Required when sourceKind is 'published'. */
    publishedValues: publishedDesignValuesSchema.optional(),
  })
  .refine((v) => v.sourceKind !== 'published' || v.publishedValues !== undefined, {
    path: ['publishedValues'],
    error: 'Enter the published design values (at least the heating dry-bulbs and their source)',
  })
  .refine((v) => v.sourceKind !== 'hourly' || v.publishedValues === undefined, {
    path: ['publishedValues'],
    error: 'A site with an hourly record computes its values; it takes no published values',
  });
export type ClimateSiteInput = z.infer<typeof climateSiteInputSchema>;

/** PATCH /api/v1/climate-sites/:siteId (publishedValues only on published sites) */
export const climateSitePatchSchema = z.strictObject({
  name: siteFields.name.optional(),
  latitude: siteFields.latitude,
  longitude: siteFields.longitude,
  elevationM: siteFields.elevationM,
  utcOffsetHours: siteFields.utcOffsetHours,
  notes: siteFields.notes,
  publishedValues: publishedDesignValuesSchema.optional(),
});
export type ClimateSitePatch = z.infer<typeof climateSitePatchSchema>;

/** One row of GET /api/v1/climate-sites */
export const climateSiteSummarySchema = z.object({
  id: z.uuid(),
  name: z.string(),
  latitude: z.number().nullable(),
  longitude: z.number().nullable(),
  elevationM: z.number().nullable(),
  utcOffsetHours: z.number().nullable(),
  sourceKind: sourceKindSchema,
  /** Invented demo data (labelled as such in the app). */
  isDemo: z.boolean(),
  /** Heating design dry-bulbs, °C, when known (computed or published). */
  heatingDb99_6: z.number().nullable(),
  heatingDb99: z.number().nullable(),
  /** Years of the hourly record (null for published values or before an upload). */
  firstYear: z.int().nullable(),
  lastYear: z.int().nullable(),
  qualifyingYearCount: z.int().nullable(),
  updatedAt: z.string(),
});
export type ClimateSiteSummary = z.infer<typeof climateSiteSummarySchema>;
export const climateSiteListSchema = z.array(climateSiteSummarySchema);

/** POST /api/v1/climate-sites/:siteId/estimate: estimate a published site's hours from another site's record. */
export const estimateInputSchema = z.strictObject({
  referenceSiteId: z.uuid('Choose a site with an hourly record as the reference'),
});
export type EstimateInput = z.infer<typeof estimateInputSchema>;

/** Where an estimated hourly record came from (docs/methods.md#shift-and-stretch). */
export const siteEstimateSchema = z.object({
  /** Null when the reference site has since been deleted (its name is kept). */
  referenceSiteId: z.uuid().nullable(),
  referenceSiteName: z.string(),
  /** Δ, K. */
  shiftK: z.number(),
  /** α. */
  stretch: z.number(),
  /** T̄, the reference's mean dry-bulb, °C. */
  referenceMeanC: z.number(),
  methodVersion: z.string(),
  /** The published values matched: the 99.6 % heating dry-bulb, °C, and the degree-days (null: not given, so α = 0). */
  matched: z.object({ db99_6: z.number(), hdd18: z.number().nullable() }),
  /** The reference record's computation it was made from. */
  referenceComputedAt: z.string(),
  computedAt: z.string(),
  /** The plain sentence every screen and report shows beside figures from this record. */
  label: z.string(),
});
export type SiteEstimate = z.infer<typeof siteEstimateSchema>;

/** The sentence shown wherever figures come from an estimated record. */
export function estimateLabel(referenceName: string, siteName: string): string {
  return `Hour-by-hour figures estimated from ${referenceName}'s record, adjusted to ${siteName}'s published values.`;
}

/** GET /api/v1/climate-sites/:siteId */
export const climateSiteSchema = climateSiteSummarySchema.extend({
  notes: z.string(),
  createdAt: z.string(),
  /** Published sites: the values as typed in. */
  publishedValues: publishedDesignValuesSchema.nullable(),
  /** Hourly sites after a confirmed upload: the computed conditions and their provenance. */
  computed: z
    .object({
      conditions: designConditionsSchema,
      methodVersion: z.string(),
      computedAt: z.string(),
      fileName: z.string().nullable(),
      rowCount: z.int(),
    })
    .nullable(),
  /** Published sites with an estimated hourly record: its provenance (the record's values are then in `computed`). */
  estimate: siteEstimateSchema.nullable(),
});
export type ClimateSite = z.infer<typeof climateSiteSchema>;

/** Design values of one span of the record, for the side-by-side table of the site page. */
export const recordWindowSchema = z.object({
  /** null: the whole record. */
  latestYears: z.int().nullable(),
  firstYear: z.int(),
  lastYear: z.int(),
  qualifyingYearCount: z.int(),
  heating: z.object({ db99_6: z.number(), db99: z.number() }),
  extremeMinMean: z.number(),
  returnPeriod50: z.number().nullable(),
  hdd18: z.number(),
});
export type RecordWindow = z.infer<typeof recordWindowSchema>;

/** GET /api/v1/climate-sites/:siteId/recent-years (sites with an hourly record, estimated or not) */
export const recentYearsSchema = z.object({
  windows: z.array(recordWindowSchema),
  trend: z.object({
    annual: z.array(z.object({ year: z.int(), minC: z.number(), db99_6C: z.number() })),
    senSlopeKPerDecade: z.number().nullable(),
    mannKendall: z.object({ s: z.number(), varS: z.number(), z: z.number(), p: z.number() }).nullable(),
    enough: z.boolean(),
    sentence: z.string(),
  }),
  /** The estimate sentence when the record is estimated. */
  estimateLabel: z.string().nullable(),
});
export type RecentYears = z.infer<typeof recentYearsSchema>;

export const distributionBinSchema = z.object({
  upperC: z.number(),
  hours: z.number(),
  cumulativeFraction: z.number(),
});
export const monthlyStatisticsSchema = z.object({
  month: z.int(),
  hours: z.number(),
  minC: z.number().nullable(),
  meanC: z.number().nullable(),
  maxC: z.number().nullable(),
});

/** GET /api/v1/climate-sites/:siteId/chart-data (hourly sites with a confirmed upload) */
export const climateChartDataSchema = z.object({
  distribution: z.object({ binWidthK: z.number(), hours: z.number(), bins: z.array(distributionBinSchema) }),
  monthly: z.array(monthlyStatisticsSchema),
});
export type ClimateChartData = z.infer<typeof climateChartDataSchema>;

const gapSchema = z.object({ start: z.string(), hours: z.number() });
/** The data-quality report shown before an upload is confirmed (the engine's QualityReport less the chart data). */
export const qualitySummarySchema = z.object({
  distinctHours: z.number(),
  firstHour: z.string().nullable(),
  lastHour: z.string().nullable(),
  yearsFound: z.array(z.int()),
  qualifyingYears: z.array(z.int()),
  completeness: z.array(
    z.object({
      year: z.int(),
      hoursPresent: z.number(),
      validHours: z.number(),
      hoursInYear: z.number(),
      completeness: z.number(),
      qualifies: z.boolean(),
    }),
  ),
  gaps: z.object({ count: z.number(), longest: gapSchema.nullable(), first: z.array(gapSchema) }),
  duplicates: z.number(),
  outOfRange: z.object({
    count: z.number(),
    byField: z.record(z.string(), z.number()),
    first: z.array(z.object({ time: z.string(), field: z.string(), value: z.number() })),
  }),
});
export type QualitySummary = z.infer<typeof qualitySummarySchema>;

/** Multipart fields of POST /api/v1/climate-sites/:siteId/uploads besides the file(s) ("files"). */
export const uploadFieldsSchema = z.strictObject({
  format: z.enum(['auto', 'csv', 'isd-lite'], { error: 'Choose CSV, ISD-Lite or automatic' }).default('auto'),
  /** JSON of a column mapping for CSVs with other column names, e.g. {"time":"Date","dry_bulb_c":"Temp"}. */
  mapping: z.string().max(4000).optional(),
});

/** The organisation's weather files being read now, and waiting their turn behind them. */
export const uploadQueueSchema = z.object({ reading: z.int().min(0), waiting: z.int().min(0) });
export type UploadQueue = z.infer<typeof uploadQueueSchema>;

/** 201 answer of an upload: parsed and checked, waiting for the user's confirmation. */
export const climateUploadSchema = z.object({
  id: z.uuid(),
  siteId: z.uuid(),
  fileName: z.string(),
  format: z.enum(['csv', 'isd-lite']),
  rowCount: z.int(),
  quality: qualitySummarySchema,
  /** What the conditions would be (null when no year qualifies). */
  preview: designConditionsSchema.nullable(),
  /** Plain messages for what the engine warned about. */
  warnings: z.array(z.string()),
  /** Yearly ISD-Lite files of one station: the station and years read from the file names, and the years with no file. */
  station: z
    .object({ id: z.string(), years: z.array(z.int()), missingYears: z.array(z.int()) })
    .nullable()
    .optional(),
  expiresAt: z.string(),
});
export type ClimateUpload = z.infer<typeof climateUploadSchema>;
