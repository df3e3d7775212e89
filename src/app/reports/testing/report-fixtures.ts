import type { ReportView } from '@shared/reports/report-schemas';

/** An invented report view for the screens (not server output). */
export function aReportView(fields: Partial<ReportView> = {}): ReportView {
  return {
    firm: { name: 'Frost Heating', logoUrl: null },
    contact: { name: 'Robin Frost', email: 'robin@frost-heating.test', phone: '555 0100' },
    title: 'Your heating options',
    note: 'Call me with questions.',
    preparedAt: '2026-11-30T09:00:00.000Z',
    computedAt: '2026-11-30T09:05:00.000Z',
    frozen: false,
    status:
      'The figures in this report may still change if your installer updates the details; they were last worked out on 2026-11-30.',
    project: { name: 'Maple Street duplex', clientName: 'Jordan Hale', siteAddress: '14 Maple Street' },
    building: 'Kept at 21.0 °C indoors, the house loses about 200 W for every degree.',
    climate: ['At Lakeview station, a typical cold winter night gets down to about −17 °C.'],
    options: [
      {
        heading: 'Option A: sized for a typical cold winter night (−17 °C)',
        tag: '99 %',
        designC: -17,
        temperature: '−17.0 °C',
        unit: 'Furnace 9 kW',
        capacity: '9.0 kW',
        figures: [
          { key: 'installedPrice', label: 'Price to install', text: '$4,000' },
          { key: 'unmetHours', label: 'Hours a year the house could get cooler than you set it', text: 'about 12' },
        ],
        sentence: 'In a typical winter this unit keeps up except for about 12 hours a year on the coldest nights.',
        odds: [],
      },
      {
        heading: 'Option B: sized for the cold to expect once in 50 years (−32 °C)',
        tag: '50-yr',
        designC: -32,
        temperature: '−32.0 °C',
        unit: 'Furnace 12 kW',
        capacity: '12.0 kW',
        figures: [
          { key: 'installedPrice', label: 'Price to install', text: '$4,600' },
          { key: 'unmetHours', label: 'Hours a year the house could get cooler than you set it', text: 'none' },
        ],
        sentence:
          'This unit keeps the house at the temperature you set in every hour of the last 30 years of weather records.',
        odds: [],
      },
    ],
    chart: {
      temperatureUnit: '°C',
      currency: 'USD',
      rows: [
        { t: -17, lifeCycleCost: 14400, unmetHours: 12, unmetLow: 6, unmetHigh: 21 },
        { t: -32, lifeCycleCost: 15000, unmetHours: 0, unmetLow: 0, unmetHigh: 0 },
      ],
      points: [
        { t: -17, label: 'A' },
        { t: -32, label: 'B' },
      ],
    },
    cautionsTitle: 'Please read: staying safe and warm',
    cautions: [
      'A colder spell than any in the record can happen.',
      'A licensed professional governs the final design.',
    ],
    provenance: 'Figures last worked out 2026-11-30 09:05 UTC.',
    unitSystem: 'SI',
    expiresAt: '2026-12-30T09:00:00.000Z',
    pdfUrl: '/api/v1/public/reports/abc/pdf',
    ...fields,
  };
}
