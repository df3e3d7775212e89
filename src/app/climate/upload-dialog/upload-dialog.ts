import { HttpEventType } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import type { FieldIssue } from '@shared/api/api-error';
import {
  CLIMATE_UPLOAD_MAX_BYTES,
  CLIMATE_UPLOAD_MAX_FILES,
  climateUploadSchema,
  type ClimateSite,
  type ClimateUpload,
  type UploadQueue,
} from '@shared/climate/climate-schemas';
import type { Subscription } from 'rxjs';
import { unitLabel } from '@shared/units/units';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage, readApiError } from '../../core/api-errors';
import { ClimateSitesApi, type UploadFormat } from '../climate-sites-api';
import { UploadQualityReport } from './upload-quality-report';

export interface UploadDialogData {
  siteId: string;
  siteName: string;
}

type Stage = 'choose' | 'uploading' | 'checking' | 'refused' | 'report' | 'storing' | 'discarding';

/** A data line of NOAA ISD-Lite: year, month, day, hour, then fixed-width numbers. */
const ISD_LITE_LINE = /^\s*\d{4}\s+\d{1,2}\s+\d{1,2}\s+\d{1,2}\s+-?\d+/;
/** Names the reader understands without a mapping. */
const STANDARD_TIME = 'time';
const STANDARD_DRY_BULB = ['dry_bulb_c', 'dry_bulb_f'];
/** Text files, and gzip-packed ones (NOAA ships ISD-Lite as .gz; the server unpacks them). */
const ALLOWED_EXTENSIONS = ['csv', 'txt', 'gz'];
const MB = 1024 * 1024;
const QUEUE_POLL_MS = 2000;

function extensionOf(name: string): string {
  const dot = name.lastIndexOf('.');
  return dot <= 0 ? '' : name.slice(dot + 1).toLowerCase();
}

/**
 * Uploads an hourly record for a site: choose files and format (and match CSV columns when the
 * header uses other names), send with progress, show the data-quality report, then store or discard.
 * Closes with the updated site when the record is stored.
 */
const TEMPERATURE_UNITS = [
  { value: 'c', label: unitLabel('temperature', 'SI') },
  { value: 'f', label: unitLabel('temperature', 'IP') },
] as const;

@Component({
  selector: 'app-upload-dialog',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    UploadQualityReport,
  ],
  templateUrl: './upload-dialog.html',
  styleUrl: './upload-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UploadDialog {
  // services
  private readonly api = inject(ClimateSitesApi);
  protected readonly auth = inject(AuthStore);
  private readonly dialogRef = inject<MatDialogRef<UploadDialog, ClimateSite>>(MatDialogRef);
  protected readonly data = inject<UploadDialogData>(MAT_DIALOG_DATA);
  private readonly fb = inject(NonNullableFormBuilder);

  /** The columns read with a unit beside them; `required` is the message when one must be chosen. */
  protected readonly pairedColumns = [
    {
      column: 'dryBulb',
      unit: 'dryBulbUnit',
      label: 'Dry-bulb temperature',
      required: 'Choose the dry-bulb column',
      units: TEMPERATURE_UNITS,
    },
    { column: 'dewPoint', unit: 'dewPointUnit', label: 'Dew point', required: null, units: TEMPERATURE_UNITS },
    {
      column: 'windSpeed',
      unit: 'windSpeedUnit',
      label: 'Wind speed',
      required: null,
      units: [
        { value: 'ms', label: 'm/s' },
        { value: 'mph', label: 'mph' },
        { value: 'kn', label: 'knots' },
      ],
    },
  ] as const;
  protected readonly stage = signal<Stage>('choose');
  protected readonly files = signal<readonly File[]>([]);
  protected readonly progress = signal(0);
  protected readonly error = signal('');
  protected readonly problems = signal<readonly FieldIssue[]>([]);
  protected readonly upload = signal<ClimateUpload | null>(null);
  /** While the server reads the file: the organisation's files being read and waiting their turn. */
  protected readonly queue = signal<UploadQueue | null>(null);

  /** Columns of the CSV header, when the file's header needs matching to our fields. */
  protected readonly columns = signal<readonly string[]>([]);
  protected readonly needsMapping = signal(false);
  protected readonly totalBytes = computed(() => this.files().reduce((sum, f) => sum + f.size, 0));
  protected readonly maxMegabytes = CLIMATE_UPLOAD_MAX_BYTES / MB;

  protected readonly format = this.fb.control<UploadFormat>('auto');
  protected readonly mapping = this.fb.group({
    time: ['', Validators.required],
    dryBulb: ['', Validators.required],
    dryBulbUnit: this.fb.control<'c' | 'f'>('c'),
    dewPoint: [''],
    dewPointUnit: this.fb.control<'c' | 'f'>('c'),
    windSpeed: [''],
    windSpeedUnit: this.fb.control<'ms' | 'mph' | 'kn'>('ms'),
    stationPressure: [''],
  });

  private request: Subscription | null = null;
  /** Counts file choices so a slow header read for an earlier choice is ignored. */
  private inspection = 0;

  constructor() {
    this.format.valueChanges.subscribe(() => void this.inspect());
    inject(DestroyRef).onDestroy(() => this.request?.unsubscribe());
    // Files are read one at a time per organisation: while this one is checked, ask every 2 s how many wait.
    effect((onCleanup) => {
      if (this.stage() !== 'checking') {
        this.queue.set(null);
        return;
      }
      void this.refreshQueue();
      const timer = setInterval(() => void this.refreshQueue(), QUEUE_POLL_MS);
      onCleanup(() => clearInterval(timer));
    });
  }

  protected megabytes(bytes: number): string {
    return bytes < 0.1 * MB ? `${Math.max(1, Math.round(bytes / 1024))} KB` : `${(bytes / MB).toFixed(1)} MB`;
  }

  protected onFiles(event: Event): void {
    const input = event.target as HTMLInputElement;
    this.files.set(Array.from(input.files ?? []));
    input.value = '';
    this.error.set('');
    void this.inspect();
  }

  /** Reads the first line of the first file: ISD-Lite, a CSV with our column names, or one to match. */
  private async inspect(): Promise<void> {
    const run = ++this.inspection;
    const first = this.files()[0];
    const format = this.format.value;
    if (!first || format === 'isd-lite') {
      this.needsMapping.set(false);
      return;
    }
    const head = await first.slice(0, 4096).text();
    const line = head.split(/\r?\n/).find((l) => l.trim() !== '' && !l.startsWith('#'));
    if (run !== this.inspection) return;
    if (line === undefined || (format === 'auto' && ISD_LITE_LINE.test(line))) {
      this.needsMapping.set(false);
      return;
    }
    const { inspectCsvHeader } = await import('@shared/climate/readers/csv-reader');
    if (run !== this.inspection) return;
    const { columns, suggestedMapping: s } = inspectCsvHeader(line);
    const names = columns.map((c) => c.toLowerCase());
    const standard = names.includes(STANDARD_TIME) && STANDARD_DRY_BULB.some((n) => names.includes(n));
    this.columns.set(columns);
    this.needsMapping.set(!standard);
    this.mapping.reset({
      time: s.time ?? '',
      dryBulb: s.dry_bulb_c ?? s.dry_bulb_f ?? '',
      dryBulbUnit: s.dry_bulb_f !== undefined ? 'f' : 'c',
      dewPoint: s.dew_point_c ?? s.dew_point_f ?? '',
      dewPointUnit: s.dew_point_f !== undefined ? 'f' : 'c',
      windSpeed: s.wind_speed_ms ?? s.wind_speed_mph ?? s.wind_speed_kn ?? '',
      windSpeedUnit: s.wind_speed_mph !== undefined ? 'mph' : s.wind_speed_kn !== undefined ? 'kn' : 'ms',
      stationPressure: s.station_pressure_kpa ?? '',
    });
  }

  /** The column mapping to send, or undefined when the file uses our column names. */
  private mappingToSend(): Record<string, string> | undefined {
    if (!this.needsMapping()) return undefined;
    const m = this.mapping.getRawValue();
    const out: Record<string, string> = { time: m.time, [`dry_bulb_${m.dryBulbUnit}`]: m.dryBulb };
    if (m.dewPoint) out[`dew_point_${m.dewPointUnit}`] = m.dewPoint;
    if (m.windSpeed) out[`wind_speed_${m.windSpeedUnit}`] = m.windSpeed;
    if (m.stationPressure) out['station_pressure_kpa'] = m.stationPressure;
    return out;
  }

  /** A reason not to send the chosen files, or ''. */
  private checkFiles(files: readonly File[]): string {
    if (files.length === 0) return 'Choose one or more files first.';
    if (files.length > CLIMATE_UPLOAD_MAX_FILES) return `Choose at most ${CLIMATE_UPLOAD_MAX_FILES} files at a time.`;
    const other = files.filter((f) => {
      const ext = extensionOf(f.name);
      return ext !== '' && !ALLOWED_EXTENSIONS.includes(ext) && !/^\d+$/.test(ext);
    });
    if (other.length > 0) {
      return `Only text files can be read: .csv, .txt, .gz, or ISD-Lite files without an extension (not ${other
        .map((f) => f.name)
        .join(', ')}).`;
    }
    if (this.totalBytes() > CLIMATE_UPLOAD_MAX_BYTES) {
      return `The files add up to ${this.megabytes(this.totalBytes())}; an upload can hold at most ${this.maxMegabytes} MB.`;
    }
    return '';
  }

  protected send(): void {
    const files = this.files();
    const problem = this.checkFiles(files);
    if (problem) {
      this.error.set(problem);
      return;
    }
    if (this.needsMapping() && this.mapping.invalid) {
      this.mapping.markAllAsTouched();
      this.error.set('Say which columns hold the time and the dry-bulb temperature.');
      return;
    }
    this.error.set('');
    this.problems.set([]);
    this.progress.set(0);
    this.stage.set('uploading');
    this.request = this.api.upload(this.data.siteId, files, this.format.value, this.mappingToSend()).subscribe({
      next: (event) => {
        if (event.type === HttpEventType.UploadProgress) {
          const total = event.total ?? this.totalBytes();
          this.progress.set(total > 0 ? Math.min(100, Math.round((100 * event.loaded) / total)) : 0);
          if (total > 0 && event.loaded >= total) this.stage.set('checking');
        } else if (event.type === HttpEventType.Response) {
          const parsed = climateUploadSchema.safeParse(event.body);
          if (parsed.success) {
            this.upload.set(parsed.data);
            this.stage.set('report');
          } else {
            this.error.set('The server answered in a way this page does not understand. Please try again.');
            this.stage.set('choose');
          }
        }
      },
      error: (err: unknown) => {
        this.request = null;
        const body = readApiError(err);
        if (body?.code === 'invalid_file') {
          this.error.set(body.message);
          this.problems.set(body.details ?? []);
          this.stage.set('refused');
        } else {
          this.error.set(apiErrorMessage(err));
          this.stage.set('choose');
        }
      },
      complete: () => {
        this.request = null;
      },
    });
  }

  private async refreshQueue(): Promise<void> {
    try {
      const q = await this.api.uploadQueue();
      if (this.stage() === 'checking') this.queue.set(q);
    } catch {
      // Only a hint: the upload's own answer is what counts.
    }
  }

  protected cancelUpload(): void {
    this.request?.unsubscribe();
    this.request = null;
    this.stage.set('choose');
  }

  protected chooseAgain(): void {
    this.error.set('');
    this.problems.set([]);
    this.stage.set('choose');
  }

  protected async store(): Promise<void> {
    const upload = this.upload();
    if (!upload || this.stage() !== 'report') return;
    this.error.set('');
    this.stage.set('storing');
    try {
      this.dialogRef.close(await this.api.confirmUpload(upload.id));
    } catch (err) {
      this.error.set(apiErrorMessage(err));
      this.stage.set('report');
    }
  }

  protected async discard(): Promise<void> {
    const upload = this.upload();
    this.stage.set('discarding');
    try {
      if (upload) await this.api.discardUpload(upload.id);
    } catch {
      // An unconfirmed upload expires on its own; nothing was stored.
    }
    this.dialogRef.close();
  }

  protected close(): void {
    this.dialogRef.close();
  }
}
