import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { aScenario } from '../testing/scenario-fixtures';
import { formatTemperatures, parseTemperatures, ScenarioSettingsPanel } from './scenario-settings';

describe('scenario settings: extra design temperatures', () => {
  it('reads temperatures typed in °F into °C (NIST SP 811: t/°C = (t/°F − 32)/1.8) and writes them back', () => {
    expect(parseTemperatures('5, -13', 'IP')).toEqual([-15, -25]);
    expect(parseTemperatures('−15; -22.5', 'SI')).toEqual([-15, -22.5]);
    expect(parseTemperatures('', 'SI')).toEqual([]);
    expect(parseTemperatures('-15, cold', 'SI')).toBeNull();
    expect(formatTemperatures([-15, -25], 'IP')).toBe('5, -13');
  });
});

describe('ScenarioSettingsPanel: tolerances of the uncertainty band', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [ScenarioSettingsPanel],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
  });

  it('shows each tolerance with its label and ± … %, from the scenario, and refuses one over 90 %', async () => {
    const fixture = TestBed.createComponent(ScenarioSettingsPanel);
    fixture.componentRef.setInput(
      'scenario',
      aScenario({
        settings: { ...aScenario().settings, tolerances: { uaPct: 12, airLeakagePct: 30, pricesPct: 5 } },
      }),
    );
    fixture.componentRef.setInput('canEdit', true);
    fixture.componentRef.setInput('unitSystem', 'SI');
    fixture.detectChanges();
    await fixture.whenStable();
    const host = fixture.nativeElement as HTMLElement;
    const fields = Array.from(host.querySelectorAll('fieldset.uncertainty mat-form-field')).slice(0, 3);
    expect(fields.map((f) => f.querySelector('mat-label')?.textContent?.trim())).toEqual([
      'UA tolerance',
      'Air leakage tolerance',
      'Energy price tolerance',
    ]);
    expect(fields.map((f) => f.querySelector('input')?.value)).toEqual(['12', '30', '5']);
    expect(fields.every((f) => (f.textContent ?? '').includes('±') && (f.textContent ?? '').includes('%'))).toBeTrue();

    const air = fields[1]?.querySelector('input');
    if (!air) throw new Error('no air leakage tolerance field');
    air.value = '95';
    air.dispatchEvent(new Event('input'));
    air.dispatchEvent(new Event('blur'));
    fixture.detectChanges();
    await fixture.whenStable();
    expect(fields[1]?.querySelector('mat-error')?.textContent).toContain('from 0 to 90 %');
    expect(fields[0]?.querySelector('mat-error')).toBeNull();
    TestBed.inject(HttpTestingController).match(() => true); // the panel's own loads of sites and lists
  });
});
