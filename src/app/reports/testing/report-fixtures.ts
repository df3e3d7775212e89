import type { ReportView } from '@shared/reports/report-schemas';

/** An invented report view for the screens (not server output). */
export function aReportView(fields: Partial<ReportView> = {}): ReportView {
  return {
    firm: { name: 'Frost Heating', logoUrl: null },
    title: 'Your heating options',
    note: 'Call me with questions.',
    preparedAt: '2026-11-30T09:00:00.000Z',
    computedAt: '2026-11-30T09:05:00.000Z',
    frozen: false,
    project: { name: 'Maple Street duplex', clientName: 'Jordan Hale', siteAddress: '14 Maple Street' },
    building: 'Kept at 21.0 °C indoors, the house loses about 200 W for every degree.',
    climate: ['At Lakeview station, the “99 % design temperature” is −17.0 °C.'],
    options: [
      {
        heading: 'Sized for the 99 % design temperature (−17.0 °C)',
        rungLabel: '99 %',
        designC: -17,
        temperature: '−17.0 °C',
        unit: 'Furnace 9 kW',
        capacity: '9.0 kW',
        figures: [
          { key: 'installedPrice', label: 'Installed price', text: '$4,000.00' },
          { key: 'unmetHours', label: 'Hours it falls behind, average year', text: 'about 12' },
        ],
        sentence: 'Sizing for −17.0 °C (99 %) instead of −32.0 °C (50-year) installs Furnace 9 kW instead of Furnace 12 kW.',
        odds: [],
      },
      {
        heading: 'Sized for the 50-year design temperature (−32.0 °C)',
        rungLabel: '50-year',
        designC: -32,
        temperature: '−32.0 °C',
        unit: 'Furnace 12 kW',
        capacity: '12.0 kW',
        figures: [
          { key: 'installedPrice', label: 'Installed price', text: '$4,600.00' },
          { key: 'unmetHours', label: 'Hours it falls behind, average year', text: 'none' },
        ],
        sentence: 'Sizing for −32.0 °C (50-year), the coldest point of the ladder, installs Furnace 12 kW.',
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
        { t: -17, label: '99 %' },
        { t: -32, label: '50-year' },
      ],
    },
    cautions: ['A colder spell than any in the record can happen.', 'A licensed professional governs the final design.'],
    provenance: 'Scenario “Gas bid”, live.',
    unitSystem: 'SI',
    expiresAt: '2026-12-30T09:00:00.000Z',
    pdfUrl: '/api/v1/public/reports/abc/pdf',
    ...fields,
  };
}
