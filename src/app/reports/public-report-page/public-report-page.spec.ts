import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { aReportView } from '../testing/report-fixtures';
import { PublicReportPage } from './public-report-page';
import { nextRequest, until } from '../../testing/until';

describe('PublicReportPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [PublicReportPage],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function open(answer: object, status = 200) {
    const fixture = TestBed.createComponent(PublicReportPage);
    fixture.componentRef.setInput('token', 'tok.en');
    fixture.detectChanges();
    const req = await nextRequest(http, '/api/v1/public/reports/tok.en');
    if (status === 200) req.flush(answer);
    else req.flush(answer, { status, statusText: 'Gone' });
    await until(() => !fixture.componentInstance['loading'](), 'the report to be read');
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  it('shows the options, their figures, the note, the contact, the cautions and when the link ends', async () => {
    const el = await open(aReportView());
    const doc = el.querySelector('[data-testid="report-document"]');
    expect(doc).not.toBeNull();
    const options = Array.from(el.querySelectorAll<HTMLElement>('.option'));
    expect(options.map((o) => o.dataset['tag'])).toEqual(['99 %', '50-yr']);
    expect(options[0]?.querySelector('.unit')?.textContent?.trim()).toBe('Furnace 9 kW');
    expect(options[0]?.querySelector('[data-figure="installedPrice"] dd')?.textContent?.trim()).toBe('$4,000');
    expect(options[0]?.querySelector('.sentence')?.textContent).toContain('typical winter');
    const text = doc?.textContent?.replace(/\s+/g, ' ') ?? '';
    expect(text).toContain('Call me with questions.');
    expect(text).toContain('A licensed professional governs the final design.');
    expect(text).toContain('This link works until December 30, 2026');
    expect(text).toContain('Please read: staying safe and warm');
    expect(text).toContain('may still change');
    const contact = el.querySelector('[data-testid="report-contact"]');
    expect(contact?.textContent).toContain('Robin Frost');
    expect(contact?.querySelector('a[href="mailto:robin@frost-heating.test"]')).not.toBeNull();
    expect(contact?.querySelector('a[href^="tel:"]')?.textContent?.trim()).toBe('555 0100');
    expect(el.querySelector<HTMLAnchorElement>('[data-testid="report-pdf"]')?.getAttribute('href')).toBe(
      '/api/v1/public/reports/abc/pdf',
    );
  });

  it('leaves the note section out when there is no note', async () => {
    const el = await open(aReportView({ note: '' }));
    expect(el.textContent).not.toContain('From your contractor');
  });

  it('shows a clear page and nothing of the report for a withdrawn link', async () => {
    const el = await open(
      {
        error: {
          code: 'link_revoked',
          message: 'This report link was withdrawn by the contractor. Ask them for a new one.',
        },
      },
      410,
    );
    expect(el.querySelector('[data-testid="report-document"]')).toBeNull();
    expect(el.querySelector('[data-testid="report-gone"]')?.textContent).toContain('withdrawn by the contractor');
  });
});
