import { BreakpointObserver } from '@angular/cdk/layout';
import { ChangeDetectionStrategy, ChangeDetectorRef, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { NgxEchartsDirective } from 'ngx-echarts';
import { map } from 'rxjs';
import type { Comparison } from '@shared/scenarios/scenario-schemas';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage } from '../../core/api-errors';
import { provideCharts } from '../../charts/provide-charts';
import { ScenariosApi } from '../scenarios-api';
import { comparisonChart, comparisonRows } from '../tradeoff-model';
import { TradeoffCautions } from '../tradeoff-page/tradeoff-cautions';

/** `/projects/:id/compare?ids=a,b…`: two to five scenarios side by side, in one table and one chart. */
@Component({
  selector: 'app-compare-page',
  imports: [RouterLink, NgxEchartsDirective, MatButtonModule, MatIconModule, MatProgressBarModule, TradeoffCautions],
  providers: [provideCharts()],
  template: `
    <section class="tr-page">
      <p class="back">
        <a [routerLink]="['/projects', id()]"><mat-icon aria-hidden="true">arrow_back</mat-icon>Project</a>
      </p>
      <header class="tr-page-header head">
        <h1>Compare scenarios</h1>
        @if (comparison()) {
          <a mat-stroked-button [href]="csvUrl()" download data-testid="compare-csv"><mat-icon>download</mat-icon>CSV</a>
        }
      </header>
      @if (loading()) {
        <mat-progress-bar mode="indeterminate" aria-label="Sweeping the scenarios" />
      }
      @if (error()) {
        <p class="tr-alert" role="alert"><mat-icon aria-hidden="true">error</mat-icon><span>{{ error() }}</span></p>
      }
      @if (comparison(); as c) {
        @for (e of c.entries; track e.scenario.id) {
          @if (e.problem) {
            <p class="tr-note" role="note"><mat-icon aria-hidden="true">info</mat-icon><span><strong>{{ e.scenario.name }}:</strong> {{ e.problem }}</span></p>
          }
        }
        <div class="table-wrap" tabindex="0" role="region" aria-label="Comparison table, scrolls sideways">
          <table class="compare-table" data-testid="compare-table">
            <thead>
              <tr>
                <th scope="col">Design point</th>
                @for (e of c.entries; track e.scenario.id) {
                  <th scope="col">
                    <a [routerLink]="['/projects', id(), 'scenarios', e.scenario.id]">{{ e.scenario.name }}</a>
                    @if (e.scenario.frozenAt) {
                      <mat-icon class="lock" aria-label="frozen">lock</mat-icon>
                    }
                  </th>
                }
              </tr>
            </thead>
            <tbody>
              @for (r of rows(); track r.label) {
                <tr>
                  <th scope="row">{{ r.label }}</th>
                  @for (cell of r.cells; track $index) {
                    <td>
                      @if (cell) {
                        <span class="temp">{{ cell.temperature }}</span>
                        <span class="unit">{{ cell.unit }}</span>
                        <span>{{ cell.installedPrice }} installed</span>
                        <span>{{ cell.lifeCycleCost }} life-cycle</span>
                        <span>{{ cell.unmetHours }} unmet h/yr</span>
                        @if (cell.unmetRange) {
                          <span class="range" data-testid="compare-range">{{ cell.unmetRange }}</span>
                        }
                        @if (cell.odds) {
                          <span class="odds" data-testid="compare-odds">Colder night: {{ cell.odds }}</span>
                        }
                        @if (cell.comfort) {
                          <span>{{ cell.comfort }}</span>
                        }
                      } @else {
                        —
                      }
                    </td>
                  }
                </tr>
              }
            </tbody>
          </table>
        </div>
        <section class="chart-card" aria-labelledby="compare-chart-title">
          <h2 id="compare-chart-title">Life-cycle cost and unmet hours</h2>
          <div class="chart" echarts role="img" data-testid="compare-chart" aria-label="Life-cycle cost and unmet hours per year of each scenario against the design temperature; the table lists the named points" [options]="chart()"></div>
        </section>
        <app-tradeoff-cautions />
      }
    </section>
  `,
  styles: `
    .table-wrap {
      overflow-x: auto;
      border: 1px solid var(--tr-rule);
      border-radius: 8px;
      margin-top: 1rem;
    }
    .compare-table {
      border-collapse: collapse;
      width: 100%;
      font-variant-numeric: tabular-nums;
      th,
      td {
        padding: 0.5rem 0.75rem;
        text-align: left;
        vertical-align: top;
        border-bottom: 1px solid var(--tr-rule);
      }
      thead th {
        background: var(--mat-sys-surface-container-low);
      }
      td span {
        display: block;
        white-space: nowrap;
      }
      .unit {
        font-weight: 600;
      }
      .temp {
        color: var(--mat-sys-on-surface-variant);
      }
    }
    .lock {
      font-size: 18px;
      width: 18px;
      height: 18px;
      vertical-align: middle;
    }
    .chart-card {
      margin-top: 1.5rem;
    }
    .chart {
      width: 100%;
      height: 400px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ComparePage {
  readonly id = input.required<string>();
  /** Query parameter: comma-separated scenario ids. */
  readonly ids = input<string>('');

  private readonly api = inject(ScenariosApi);
  private readonly auth = inject(AuthStore);
  private readonly cdr = inject(ChangeDetectorRef);
  private readonly compact = toSignal(
    inject(BreakpointObserver)
      .observe('(max-width: 599.98px)')
      .pipe(map((s) => s.matches)),
    { initialValue: false },
  );

  protected readonly comparison = signal<Comparison | null>(null);
  protected readonly loading = signal(false);
  protected readonly error = signal('');
  private readonly idList = computed(() => this.ids().split(',').filter((x) => x.length > 0));
  protected readonly rows = computed(() => comparisonRows(this.comparison()?.entries.map((e) => e.sweep) ?? [], this.auth.unitSystem()));
  protected readonly chart = computed(() =>
    comparisonChart(this.comparison()?.entries.map((e) => ({ name: e.scenario.name, sweep: e.sweep })) ?? [], this.auth.unitSystem(), this.compact()),
  );
  protected readonly csvUrl = computed(() => this.api.compareCsvUrl(this.id(), this.idList()));

  constructor() {
    effect(() => {
      const projectId = this.id();
      const ids = this.idList();
      untracked(() => void this.load(projectId, ids));
    });
  }

  private async load(projectId: string, ids: string[]): Promise<void> {
    this.loading.set(true);
    this.error.set('');
    try {
      this.comparison.set(await this.api.compare(projectId, ids));
    } catch (err) {
      this.comparison.set(null);
      this.error.set(apiErrorMessage(err, 'The scenarios could not be compared.'));
    } finally {
      this.loading.set(false);
      this.cdr.markForCheck();
    }
  }
}
