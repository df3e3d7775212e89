/** Made-up climate sites, conditions and uploads for the client specs (values in SI). */
import type { UnitSystem } from '@shared/units/units';
import type { Role } from '@shared/auth/roles';
import type { DesignConditions } from '@shared/climate/design-conditions-schema';
import type {
  ClimateChartData,
  ClimateSite,
  ClimateSiteSummary,
  ClimateUpload,
  RecentYears,
} from '@shared/climate/climate-schemas';
import { signedInSession } from '../../testing/test-sessions';

export const SITE_ID = '5a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c4d';
export const UPLOAD_ID = '6b2c3d4e-5f6a-4b7c-9d8e-0f1a2b3c4d5e';

export function sessionWithUnits(role: Role, unitSystem: UnitSystem) {
  const session = signedInSession(role);
  return { ...session, user: session.user && { ...session.user, unitSystem } };
}

export function aSummary(overrides: Partial<ClimateSiteSummary> = {}): ClimateSiteSummary {
  return {
    id: SITE_ID,
    name: 'Lakeview station',
    latitude: 45.5,
    longitude: -73.6,
    elevationM: 36,
    utcOffsetHours: -5,
    sourceKind: 'hourly',
    isDemo: false,
    heatingDb99_6: -20,
    heatingDb99: -17.5,
    firstYear: 1995,
    lastYear: 2024,
    qualifyingYearCount: 30,
    updatedAt: '2026-11-20T10:00:00.000Z',
    ...overrides,
  };
}

export function someConditions(): DesignConditions {
  return {
    period: { firstYear: 1995, lastYear: 2024, qualifyingYears: [1995, 1996, 1997], validHours: 26000 },
    heating: { db99_6: -20, db99: -17.5 },
    cooling: { db0_4: 30.5, db1: 29, db2: 27.5 },
    extremeMin: { mean: -26, sd: 3, returnPeriod: { '5': -28.5, '10': -30, '20': -31.5, '50': -33.5 } },
    humidification: {
      dp99_6: { dewPoint: -27, humidityRatio: 0.4, meanCoincidentDryBulb: -20.5, relativeHumidity: 55 },
      dp99: { dewPoint: -24, humidityRatio: 0.5, meanCoincidentDryBulb: -18, relativeHumidity: 60 },
    },
    wind: { coldestMonth: 1, coldestMonth1: 11, coincident99_6: 3.5, annual1: 10, annual2_5: 8.5, annual5: 7.5 },
    hdd18: 4500,
    warnings: [],
  };
}

export function anHourlySite(overrides: Partial<ClimateSite> = {}): ClimateSite {
  return {
    ...aSummary(),
    notes: '',
    createdAt: '2026-11-20T09:00:00.000Z',
    publishedValues: null,
    computed: {
      conditions: someConditions(),
      methodVersion: 'climate-1.0.0',
      computedAt: '2026-11-20T10:00:00.000Z',
      fileName: 'lakeview.csv',
      rowCount: 26280,
    },
    estimate: null,
    ...overrides,
  };
}

export function aPublishedSite(): ClimateSite {
  return {
    ...aSummary({ sourceKind: 'published', name: 'Hilltop (table)', firstYear: null, lastYear: null }),
    qualifyingYearCount: null,
    notes: '',
    createdAt: '2026-11-20T09:00:00.000Z',
    publishedValues: { source: 'Regional design table, 2020 edition', heating: { db99_6: -20, db99: -17.5 } },
    computed: null,
    estimate: null,
  };
}

/** Recent years of a 16-year record with a slightly warming coldest hour (invented). */
export function someRecentYears(): RecentYears {
  const annual = Array.from({ length: 16 }, (_, i) => ({
    year: 2009 + i,
    minC: -30 + i * 0.1,
    db99_6C: -22 + i * 0.05,
  }));
  const window = (latestYears: number | null, firstYear: number, db99_6: number) => ({
    latestYears,
    firstYear,
    lastYear: 2024,
    qualifyingYearCount: 2025 - firstYear,
    heating: { db99_6, db99: db99_6 + 3 },
    extremeMinMean: -29,
    returnPeriod50: -36.5,
    hdd18: 4500,
  });
  return {
    windows: [window(null, 2009, -22.4), window(10, 2015, -21.8), window(15, 2010, -22.1)],
    trend: {
      annual,
      senSlopeKPerDecade: 1,
      mannKendall: { s: 120, varS: 493.3, z: 5.36, p: 0.0000001 },
      enough: true,
      sentence:
        'Over 2009–2024 the coldest hour of the year has warmed by about 1.0 K per decade; a trend this strong would arise by chance less than 1 time in 1000.',
    },
    estimateLabel: null,
  };
}

export function someChartData(): ClimateChartData {
  const bins = [-25, -20, -15, -10, 0, 10, 20, 30].map((upperC, i, all) => ({
    upperC,
    hours: 10,
    cumulativeFraction: (i + 1) / all.length,
  }));
  return {
    distribution: { binWidthK: 0.5, hours: 80, bins },
    monthly: Array.from({ length: 12 }, (_, i) => ({
      month: i + 1,
      hours: 720,
      minC: -25 + i,
      meanC: -5 + i,
      maxC: 10 + i,
    })),
  };
}

export function anUpload(): ClimateUpload {
  return {
    id: UPLOAD_ID,
    siteId: SITE_ID,
    fileName: 'lakeview.csv',
    format: 'csv',
    rowCount: 26280,
    quality: {
      distinctHours: 26200,
      firstHour: '2021-01-01T00:00:00.000Z',
      lastHour: '2023-12-31T23:00:00.000Z',
      yearsFound: [2021, 2022, 2023],
      qualifyingYears: [2021, 2023],
      completeness: [
        { year: 2021, hoursPresent: 8760, validHours: 8700, hoursInYear: 8760, completeness: 0.993, qualifies: true },
        { year: 2022, hoursPresent: 6000, validHours: 5900, hoursInYear: 8760, completeness: 0.673, qualifies: false },
        { year: 2023, hoursPresent: 8760, validHours: 8760, hoursInYear: 8760, completeness: 1, qualifies: true },
      ],
      gaps: {
        count: 2,
        longest: { start: '2022-03-04T06:00:00.000Z', hours: 2700 },
        first: [{ start: '2022-03-04T06:00:00.000Z', hours: 2700 }],
      },
      duplicates: 3,
      outOfRange: {
        count: 1,
        byField: { dryBulbC: 1, dewPointC: 0, windSpeedMs: 0, stationPressureKpa: 0 },
        first: [{ time: '2021-07-02T14:00:00.000Z', field: 'dryBulbC', value: 99.9 }],
      },
    },
    preview: someConditions(),
    warnings: ['2022 was left out: too many of its hours are missing.'],
    expiresAt: '2026-11-21T10:00:00.000Z',
  };
}
