import { ChangeDetectionStrategy, Component, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { ReportView } from '@shared/reports/report-schemas';
import { apiErrorMessage, readApiError } from '../../core/api-errors';
import { ReportDocument } from '../report-document/report-document';
import { ReportsApi } from '../reports-api';

/** `/r/:token`: a client report opened from its link, with no account. */
@Component({
  selector: 'app-public-report-page',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, ReportDocument],
  template: `
    <main class="public-report">
      @if (loading()) {
        <mat-progress-bar mode="indeterminate" aria-label="Opening the report" />
      }
      @if (gone(); as message) {
        <section class="gone" data-testid="report-gone">
          <mat-icon aria-hidden="true">link_off</mat-icon>
          <h1>This report is no longer available</h1>
          <p>{{ message }}</p>
        </section>
      }
      @if (error()) {
        <p class="tr-alert" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon><span>{{ error() }}</span>
        </p>
      }
      @if (view(); as v) {
        <div class="tools no-print">
          <a mat-stroked-button [href]="v.pdfUrl" target="_blank" rel="noopener" data-testid="report-pdf"
            ><mat-icon>picture_as_pdf</mat-icon>PDF</a
          >
          <button mat-stroked-button type="button" (click)="print()"><mat-icon>print</mat-icon>Print</button>
        </div>
        <app-report-document [view]="v" />
      }
    </main>
  `,
  styles: `
    .public-report {
      padding: 1.5rem 1rem 3rem;
      background: var(--mat-sys-surface);
      min-height: 100vh;
      box-sizing: border-box;
    }
    .tools {
      display: flex;
      justify-content: flex-end;
      gap: 0.5rem;
      max-width: 56rem;
      margin: 0 auto 0.5rem;
    }
    .gone {
      max-width: 32rem;
      margin: 4rem auto;
      text-align: center;
      mat-icon {
        font-size: 48px;
        width: 48px;
        height: 48px;
        color: var(--tr-ink);
      }
    }
    @media print {
      .public-report {
        padding: 0;
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PublicReportPage {
  readonly token = input.required<string>();
  private readonly api = inject(ReportsApi);
  protected readonly view = signal<ReportView | null>(null);
  protected readonly loading = signal(true);
  protected readonly gone = signal('');
  protected readonly error = signal('');

  constructor() {
    effect(() => {
      const token = this.token();
      untracked(() => void this.load(token));
    });
  }

  private async load(token: string): Promise<void> {
    try {
      this.view.set(await this.api.publicView(token));
    } catch (err) {
      const e = readApiError(err);
      if (e?.code === 'link_expired' || e?.code === 'link_revoked' || e?.code === 'not_found') {
        this.gone.set(
          e.code === 'not_found'
            ? 'This link is not valid. Check that it was copied whole, or ask your contractor for a new one.'
            : e.message,
        );
      } else {
        this.error.set(apiErrorMessage(err, 'The report could not be opened. Try again in a moment.'));
      }
    } finally {
      this.loading.set(false);
    }
  }

  protected print(): void {
    window.print();
  }
}
