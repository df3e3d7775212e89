import { formPathOf } from './building-form';
import { displayText, formatPower, fromDisplay, groupDigits, toDisplay, unit } from './building-units';

describe('building units', () => {
  it('writes heat flows as kW or grouped Btu/h', () => {
    expect(formatPower(12_345, 'SI')).toBe('12.3 kW');
    expect(formatPower(850, 'SI')).toBe('850 W');
    // 12 280 W × 3.41214 Btu/h per W = 41 901 Btu/h → nearest 100.
    expect(formatPower(12_280, 'IP')).toBe('41,900 Btu/h');
    // 1000 W = 3412.1 Btu/h → nearest 10.
    expect(formatPower(1000, 'IP')).toBe('3,410 Btu/h');
    expect(groupDigits(-1234567)).toBe('−1,234,567');
  });

  it('converts a UA in Btu/(h·°F) with the size of a Fahrenheit degree, and a temperature with its offset', () => {
    // 1 Btu/h = 0.293071 W and 1 °F of difference = 5/9 K: 100 Btu/(h·°F) = 52.753 W/K.
    expect(fromDisplay(unit.quantity('conductance'), 100, 'IP')).toBeCloseTo(52.753, 3);
    expect(fromDisplay(unit.quantity('temperature'), 32, 'IP')).toBeCloseTo(0, 9);
    expect(fromDisplay(unit.quantity('temperature'), 70, 'IP')).toBeCloseTo(21.111, 3);
    expect(fromDisplay(unit.percentOfFraction, 70, 'IP')).toBeCloseTo(0.7, 12);
    expect(toDisplay(unit.fixed('ACH50'), 3, 'IP')).toBe(3);
  });

  it('shows SI values as stored and rounds only converted text', () => {
    expect(displayText(unit.quantity('conductance'), 123.456, 'SI')).toBe('123.456');
    // 123.456 W/K ÷ 0.527527 = 234.03 Btu/(h·°F).
    expect(displayText(unit.quantity('conductance'), 123.456, 'IP')).toBe('234.03');
    // 0.28 W/(m²·K) ÷ 5.678263 = 0.04931 Btu/(h·ft²·°F).
    expect(displayText(unit.quantity('uValue'), 0.28, 'IP')).toBe('0.0493');
  });

  it('maps server and schema paths to the form’s fields', () => {
    expect(formPathOf('building.airLeakage.ach50')).toBe('airLeakage.ach50');
    expect(formPathOf('building.conduction.components.2.rValue')).toBe('conduction.components.2.value');
    expect(formPathOf('conduction.components.0.uValue')).toBe('conduction.components.0.value');
    expect(formPathOf('building.thermalMass.floorAreaM2')).toBe('thermalMass.floorAreaM2');
  });
});
