/**
 * Client reports: a homeowner-readable summary of two or three design points of a scenario, shared
 * by an expiring, revocable link (the token is stored only as a hash) and by e-mail, with a PDF.
 */
import { z } from 'zod';
import { apiErrorSchema } from '../api/api-error';
import { unitSystemSchema } from '../auth/auth-schemas';
import { term } from '../glossary/glossary';

export const REPORT_TITLE_MAX = 160;
export const REPORT_NOTE_MAX = 2000;
export const REPORT_POINTS_MAX = 3;
export const LINK_DAYS_DEFAULT = 30;
export const LINK_DAYS_MAX = 365;
export const LOGO_MAX_BYTES = 1024 * 1024;

export const reportFigureKeys = [
  'installedPrice',
  'annualCost',
  'lifeCycleCost',
  'compressor',
  'runHours',
  'backupHours',
  'backupEnergy',
  'unmetHours',
  'unmetWorstYear',
  'lowestIndoor',
] as const;
export type ReportFigure = (typeof reportFigureKeys)[number];
/** The figures as the homeowner reads them (the glossary's plain words). */
export const reportFigureLabels: Record<ReportFigure, string> = {
  installedPrice: term('installedPrice', 'homeowner'),
  annualCost: term('annualCost', 'homeowner'),
  lifeCycleCost: term('lifeCycleCost', 'homeowner'),
  compressor: term('compressorAtDesign', 'homeowner'),
  runHours: term('runHours', 'homeowner'),
  backupHours: term('backupHours', 'homeowner'),
  backupEnergy: term('backupEnergy', 'homeowner'),
  unmetHours: term('unmetHours', 'homeowner'),
  unmetWorstYear: term('unmetHoursWorstYear', 'homeowner'),
  lowestIndoor: term('lowestIndoor', 'homeowner'),
};
/** The same figures as the designer picks them in the composer (the trade's terms). */
export const reportFigureDesignerLabels: Record<ReportFigure, string> = {
  installedPrice: term('installedPrice'),
  annualCost: term('annualCost'),
  lifeCycleCost: term('lifeCycleCost'),
  compressor: term('compressorAtDesign'),
  runHours: term('runHours'),
  backupHours: term('backupHours'),
  backupEnergy: term('backupEnergy'),
  unmetHours: term('unmetHours'),
  unmetWorstYear: term('unmetHoursWorstYear'),
  lowestIndoor: term('lowestIndoor'),
};
export const REPORT_PHONE_MAX = 40;

/** POST /api/v1/projects/:projectId/reports */
export const reportInputSchema = z.strictObject({
  scenarioId: z.uuid('Choose a scenario'),
  title: z
    .string({ error: 'Enter a title' })
    .trim()
    .min(1, 'Enter a title')
    .max(REPORT_TITLE_MAX, `Use at most ${REPORT_TITLE_MAX} characters`),
  note: z
    .string({ error: 'Enter the note as text' })
    .trim()
    .max(REPORT_NOTE_MAX, `Use at most ${REPORT_NOTE_MAX} characters`)
    .default(''),
  /** The phone number the homeowner can call, shown with the designer's name and e-mail. */
  contactPhone: z
    .string({ error: 'Enter the phone number as text' })
    .trim()
    .max(REPORT_PHONE_MAX, `Use at most ${REPORT_PHONE_MAX} characters`)
    .regex(/^[\d\s()+.\-/x]*$/i, 'Enter a phone number with digits, spaces and + ( ) - . / only')
    .default(''),
  /** Design temperatures of the sweep rows to present, °C. */
  points: z
    .array(z.number({ error: 'A design point is a temperature (°C)' }).min(-70).max(20), {
      error: 'Choose the design points to present',
    })
    .min(1, 'Choose at least one design point')
    .max(REPORT_POINTS_MAX, `Choose at most ${REPORT_POINTS_MAX} design points`),
  figures: z
    .array(z.enum(reportFigureKeys, { error: 'Unknown figure' }))
    .min(1, 'Choose at least one figure to show')
    .default([...reportFigureKeys]),
  unitSystem: unitSystemSchema.default('SI'),
});
export type ReportInput = z.input<typeof reportInputSchema>;

/** POST …/reports/:reportId/links */
export const linkInputSchema = z.strictObject({
  expiresInDays: z
    .int({ error: 'Enter the number of days as a whole number' })
    .min(1, 'A link lasts at least a day')
    .max(LINK_DAYS_MAX, `A link lasts at most ${LINK_DAYS_MAX} days`)
    .default(LINK_DAYS_DEFAULT),
});

/** POST …/reports/:reportId/send */
export const sendInputSchema = z.strictObject({
  to: z.email('Enter the client’s e-mail address').max(320),
  message: z.string().trim().max(1000, 'Use at most 1000 characters').default(''),
  expiresInDays: linkInputSchema.shape.expiresInDays,
});

export const linkSchema = z.object({
  id: z.uuid(),
  createdAt: z.string(),
  expiresAt: z.string(),
  revokedAt: z.string().nullable(),
  status: z.enum(['active', 'expired', 'revoked']),
});
export type ReportLink = z.infer<typeof linkSchema>;

export const sendSchema = z.object({
  id: z.uuid(),
  recipient: z.string(),
  status: z.enum(['sent', 'failed']),
  error: z.string().nullable(),
  sentAt: z.string(),
  linkId: z.uuid().nullable(),
});
export type ReportSend = z.infer<typeof sendSchema>;

export const reportSchema = z.object({
  id: z.uuid(),
  projectId: z.uuid(),
  scenarioId: z.uuid(),
  scenarioName: z.string(),
  scenarioFrozen: z.boolean(),
  title: z.string(),
  note: z.string(),
  contactPhone: z.string(),
  points: z.array(z.number()),
  figures: z.array(z.enum(reportFigureKeys)),
  unitSystem: unitSystemSchema,
  createdByName: z.string(),
  createdAt: z.string(),
  links: z.array(linkSchema),
  sends: z.array(sendSchema),
});
export type Report = z.infer<typeof reportSchema>;
export const reportListSchema = z.array(reportSchema);

/** 201 of POST …/links: the only time the link's address (with its token) is shown. */
export const linkCreatedSchema = z.object({ link: linkSchema, url: z.string() });

/** 502 `send_failed` of POST …/send and …/retry: the refusal, with the report holding the failed send (retry by `sendId`). */
export const sendFailedSchema = apiErrorSchema.extend({ report: reportSchema, sendId: z.string() });
export type SendFailed = z.infer<typeof sendFailedSchema>;

// ---------------------------------------------------------------------------------------------
// What the client sees (GET /api/v1/public/reports/:token, and the signed-in preview)

export const reportOptionViewSchema = z.object({
  /** "Sized for the 99 % design temperature (−17.0 °C)". */
  heading: z.string(),
  /** The short tag of the design value ("99 %", "50-yr") or the temperature. */
  tag: z.string(),
  designC: z.number(),
  temperature: z.string(),
  unit: z.string(),
  capacity: z.string(),
  /** Figure key → display text, for the figures the designer chose. */
  figures: z.array(z.object({ key: z.enum(reportFigureKeys), label: z.string(), text: z.string() })),
  sentence: z.string(),
  /** Plain sentences on the odds of a colder night, how sure the figures are, and the price of comfort. */
  odds: z.array(z.string()).default([]),
});
export type ReportOptionView = z.infer<typeof reportOptionViewSchema>;

export const reportViewSchema = z.object({
  firm: z.object({ name: z.string(), logoUrl: z.string().nullable() }),
  /** Who to call or write to about the report: the designer who prepared it. */
  contact: z.object({ name: z.string(), email: z.string(), phone: z.string() }),
  title: z.string(),
  note: z.string(),
  preparedAt: z.string(),
  computedAt: z.string(),
  frozen: z.boolean(),
  /** Whether the figures are fixed or may change, in plain words. */
  status: z.string(),
  project: z.object({ name: z.string(), clientName: z.string(), siteAddress: z.string() }),
  building: z.string(),
  climate: z.array(z.string()),
  options: z.array(reportOptionViewSchema),
  chart: z.object({
    temperatureUnit: z.string(),
    currency: z.string(),
    rows: z.array(
      z.object({
        t: z.number(),
        lifeCycleCost: z.number().nullable(),
        unmetHours: z.number().nullable(),
        /** 10th and 90th percentiles of the unmet hours over the uncertainty draws (null without them). */
        unmetLow: z.number().nullable().default(null),
        unmetHigh: z.number().nullable().default(null),
      }),
    ),
    points: z.array(z.object({ t: z.number(), label: z.string() })),
  }),
  cautionsTitle: z.string(),
  cautions: z.array(z.string()),
  provenance: z.string(),
  unitSystem: unitSystemSchema,
  expiresAt: z.string().nullable(),
  pdfUrl: z.string(),
});
export type ReportView = z.infer<typeof reportViewSchema>;
