import { formatTemperatures, parseTemperatures } from './scenario-settings';

describe('scenario settings: extra design temperatures', () => {
  it('reads temperatures typed in °F into °C (NIST SP 811: t/°C = (t/°F − 32)/1.8) and writes them back', () => {
    expect(parseTemperatures('5, -13', 'IP')).toEqual([-15, -25]);
    expect(parseTemperatures('−15; -22.5', 'SI')).toEqual([-15, -22.5]);
    expect(parseTemperatures('', 'SI')).toEqual([]);
    expect(parseTemperatures('-15, cold', 'SI')).toBeNull();
    expect(formatTemperatures([-15, -25], 'IP')).toBe('5, -13');
  });
});
