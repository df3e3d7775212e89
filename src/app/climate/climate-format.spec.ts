import { designValueRows, hoursPerYear, yearsLabel } from './climate-format';
import { someConditions } from './testing/climate-fixtures';

describe('climate-format', () => {
  it('turns the percentages of a 8760-hour year into hours', () => {
    // 0.4 % × 8760 h = 35.04 h; 1 % = 87.6 h; 2 % = 175.2 h; 2.5 % = 219 h; 5 % = 438 h.
    expect(hoursPerYear(0.4)).toBe(35);
    expect(hoursPerYear(1)).toBe(88);
    expect(hoursPerYear(2)).toBe(175);
    expect(hoursPerYear(2.5)).toBe(219);
    expect(hoursPerYear(5)).toBe(438);
  });

  it('labels the span of years and how many qualified', () => {
    expect(yearsLabel(1995, 2024, 30)).toBe('1995–2024 (30)');
    expect(yearsLabel(2020, 2020, 1)).toBe('2020 (1)');
    expect(yearsLabel(null, null, null)).toBe('—');
  });

  it('shows missing published values as a dash', () => {
    const rows = designValueRows({ heating: { db99_6: -20, db99: -17.5 } }, 'SI');
    expect(rows.find((r) => r.key === 'heating-99.6')?.value).toBe('−20.0 °C');
    expect(rows.find((r) => r.key === 'return-50')?.value).toBe('—');
    expect(rows.find((r) => r.key === 'hdd')?.value).toBe('—');
  });

  it('explains the 50-year night as a 2 % chance in any year', () => {
    const row = designValueRows(someConditions(), 'SI').find((r) => r.key === 'return-50');
    expect(row?.explanation).toContain('once in 50 years (2 % chance in any year)');
    expect(row?.value).toBe('−33.5 °C');
  });
});
