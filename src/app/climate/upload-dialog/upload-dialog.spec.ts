import { HttpEventType, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { AuthStore } from '../../auth/auth-store';
import { SITE_ID, UPLOAD_ID, anHourlySite, anUpload, sessionWithUnits } from '../testing/climate-fixtures';
import { UploadDialog, type UploadDialogData } from './upload-dialog';
import { settle } from '../../testing/test-sessions';
import { until } from '../../testing/until';

const UPLOAD_URL = `/api/v1/climate-sites/${SITE_ID}/uploads`;

describe('UploadDialog', () => {
  let http: HttpTestingController;
  let dialogRef: jasmine.SpyObj<MatDialogRef<UploadDialog>>;

  beforeEach(() => {
    dialogRef = jasmine.createSpyObj<MatDialogRef<UploadDialog>>('MatDialogRef', ['close']);
    TestBed.configureTestingModule({
      imports: [UploadDialog],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        {
          provide: MAT_DIALOG_DATA,
          useValue: { siteId: SITE_ID, siteName: 'Lakeview station' } satisfies UploadDialogData,
        },
        { provide: MatDialogRef, useValue: dialogRef },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render() {
    TestBed.inject(AuthStore).setSession(sessionWithUnits('designer', 'SI'));
    const fixture = TestBed.createComponent(UploadDialog);
    fixture.detectChanges();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const text = () => el.textContent?.replace(/\s+/g, ' ') ?? '';
    const button = (label: string) =>
      Array.from(el.querySelectorAll<HTMLButtonElement>('button')).find((b) => b.textContent?.trim() === label);
    const choose = async (...files: File[]) => {
      const input = el.querySelector<HTMLInputElement>('input[type="file"]')!;
      const transfer = new DataTransfer();
      for (const f of files) transfer.items.add(f);
      input.files = transfer.files;
      input.dispatchEvent(new Event('change'));
      await fixture.whenStable();
    };
    const stable = async () => {
      await settle();
      await fixture.whenStable();
    };
    return { fixture, el, text, button, choose, stable };
  }

  const standardCsv = () =>
    new File(['time,dry_bulb_c,dew_point_c\n2021-01-01T00:00Z,-5.0,-9.1\n'], 'lakeview.csv', { type: 'text/csv' });

  it('shows the upload progress, then the check, then the data-quality report', async () => {
    const { el, text, button, choose, stable } = await render();
    await choose(standardCsv());
    await stable();
    expect(el.querySelector('[data-testid="column-mapping"]')).toBeNull();
    button('Upload and check')!.click();
    await stable();

    const req = http.expectOne({ method: 'POST', url: UPLOAD_URL });
    const body = req.request.body as FormData;
    expect(body.get('format')).toBe('auto');
    expect((body.get('files') as File).name).toBe('lakeview.csv');
    expect(body.get('mapping')).toBeNull();
    expect(req.request.reportProgress).toBeTrue();

    req.event({ type: HttpEventType.UploadProgress, loaded: 40, total: 100 });
    await stable();
    expect(text()).toContain('Uploading… 40 %');
    const bar = el.querySelector('[data-testid="upload-progress"] mat-progress-bar');
    expect(bar?.getAttribute('aria-valuenow')).toBe('40');

    req.event({ type: HttpEventType.UploadProgress, loaded: 100, total: 100 });
    await stable();
    expect(text()).toContain('Checking the record…');
    // While the server reads it, the dialog asks how many of the organisation's files wait their turn.
    http.expectOne({ method: 'GET', url: '/api/v1/climate-upload-queue' }).flush({ reading: 1, waiting: 1 });
    await stable();
    expect(el.querySelector('[data-testid="upload-waiting"]')?.textContent?.replace(/\s+/g, ' ')).toContain(
      '1 being read, 1 waiting',
    );

    req.flush(anUpload(), { status: 201, statusText: 'Created' });
    await stable();
    expect(el.querySelector('[data-testid="years-found"]')?.textContent?.replace(/\s+/g, ' ').trim()).toBe(
      '3 (2021–2023)',
    );
    expect(el.querySelector('[data-testid="years-qualifying"]')?.textContent).toContain('2 of 3');
    const years = Array.from(el.querySelectorAll('[data-testid="completeness-table"] tbody tr'), (tr) =>
      tr.textContent?.replace(/\s+/g, ' ').trim(),
    );
    expect(years.length).toBe(3);
    expect(years[1]).toContain('2022');
    expect(years[1]).toContain('67.3%');
    expect(years[1]).toContain('No, too many hours missing');
    expect(years[0]).toContain('Yes');
    expect(text()).toContain('the longest is 2,700 hours from 2022-03-04 06:00 UTC');
    expect(text()).toContain('3 repeated hours');
    expect(text()).toContain('2021-07-02 14:00 UTC: Dry-bulb 99.9 °C');
    expect(text()).toContain('2022 was left out: too many of its hours are missing.');
    expect(el.querySelector('[data-testid="upload-preview"]')?.textContent).toContain('−20.0 °C');
    expect(el.querySelector('[data-testid="upload-waiting"]')).toBeNull();
    expect(button('Discard')).toBeDefined();

    button('Store this record')!.click();
    await stable();
    const confirm = http.expectOne({ method: 'POST', url: `/api/v1/climate-uploads/${UPLOAD_ID}/confirm` });
    confirm.flush(anHourlySite());
    await stable();
    expect(dialogRef.close).toHaveBeenCalledTimes(1);
    expect(dialogRef.close.calls.mostRecent().args[0]?.id).toBe(SITE_ID);
  });

  it('lists the line problems of a refused file and stores nothing', async () => {
    const { el, text, button, choose, stable } = await render();
    await choose(standardCsv());
    await stable();
    button('Upload and check')!.click();
    await stable();
    http.expectOne({ method: 'POST', url: UPLOAD_URL }).flush(
      {
        error: {
          code: 'invalid_file',
          message: 'The file could not be read',
          details: [
            { path: 'line 12', message: 'The time "2021-13-01T00:00" is not a valid date' },
            { path: 'line 40', message: 'The dry-bulb "warm" is not a number' },
          ],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await stable();
    const problems = Array.from(el.querySelectorAll('[data-testid="upload-refused"] li'), (li) =>
      li.textContent?.replace(/\s+/g, ' ').trim(),
    );
    expect(problems).toEqual([
      'line 12: The time "2021-13-01T00:00" is not a valid date',
      'line 40: The dry-bulb "warm" is not a number',
    ]);
    expect(text()).toContain('Nothing was stored');
    expect(button('Store this record')).toBeUndefined();
    expect(dialogRef.close).not.toHaveBeenCalled();
  });

  it('asks which columns to read when the header uses other names, and sends the mapping', async () => {
    const { el, button, choose, stable } = await render();
    await choose(new File(['Date/Time,Temp (F),Dew Pt\n2021-01-01T00:00Z,23,15\n'], 'other.csv'));
    await until(() => el.querySelector('[data-testid="column-mapping"]') !== null, 'the column mapping');
    await stable();
    button('Upload and check')!.click();
    await stable();
    const req = http.expectOne({ method: 'POST', url: UPLOAD_URL });
    const mapping = JSON.parse((req.request.body as FormData).get('mapping') as string);
    expect(mapping).toEqual({ time: 'Date/Time', dry_bulb_f: 'Temp (F)', dew_point_c: 'Dew Pt' });
    req.flush(anUpload(), { status: 201, statusText: 'Created' });
    await stable();
  });

  it('refuses files that are not text before sending them', async () => {
    const { text, button, choose, stable } = await render();
    await choose(new File(['PK'], 'record.xlsx'));
    await stable();
    button('Upload and check')!.click();
    await stable();
    http.expectNone({ method: 'POST', url: UPLOAD_URL });
    expect(text()).toContain('Only text files can be read');
  });
});
