import { ChangeDetectionStrategy, Component, computed, inject, input, resource, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { NgxEchartsDirective } from 'ngx-echarts';
import type { Comparison } from '@shared/scenarios/scenario-schemas';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage } from '../../core/api-errors';
import { provideCharts } from '../../charts/provide-charts';
import { ScenariosApi } from '../scenarios-api';
import { TermInfo } from '../../ui/term-info/term-info';
import { comparePointChoices, comparisonTable, differenceRows, type ComparePoint } from '../compare-rows';
import { comparisonChart } from '../tradeoff-charts';
import { TradeoffCautions } from '../tradeoff-page/tradeoff-cautions';
import { compactScreen } from '../../core/compact-screen';

/** `/projects/:id/compare?ids=a,b…`: two to five scenarios side by side, in one table and one chart. */
@Component({
  selector: 'app-compare-page',
  imports: [
    RouterLink,
    NgxEchartsDirective,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    TermInfo,
    TradeoffCautions,
  ],
  providers: [provideCharts()],
  template: `
    <section class="tr-page">
      <p class="back">
        <a [routerLink]="['/projects', id()]"><mat-icon aria-hidden="true">arrow_back</mat-icon>Project</a>
      </p>
      <header class="tr-page-header head">
        <h1>Compare scenarios</h1>
        @if (comparison()) {
          <a mat-stroked-button [href]="csvUrl()" download data-testid="compare-csv"
            ><mat-icon>download</mat-icon>CSV</a
          >
        }
      </header>
      @if (loading()) {
        <div class="progress" role="status" aria-live="polite">
          <mat-progress-bar mode="indeterminate" aria-label="Sweeping the scenarios" />
          <span
            >Sweeping {{ idList().length }} scenarios over the hourly record; a first sweep of a site takes a few
            seconds…</span
          >
        </div>
      }
      @if (error()) {
        <p class="tr-alert" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon><span>{{ error() }}</span>
        </p>
      }
      @if (comparison(); as c) {
        @for (e of c.entries; track e.scenario.id) {
          @if (e.problem) {
            <p class="tr-note" role="note">
              <mat-icon aria-hidden="true">info</mat-icon
              ><span
                ><strong>{{ e.scenario.name }}:</strong> {{ e.problem }}</span
              >
            </p>
          }
        }
        <div class="controls">
          <mat-form-field subscriptSizing="dynamic">
            <mat-label>Design point</mat-label>
            <mat-select [value]="point()" (selectionChange)="point.set($event.value)" data-testid="compare-point">
              @for (p of pointChoices(); track p.value) {
                <mat-option [value]="p.value">{{ p.text }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <mat-form-field subscriptSizing="dynamic">
            <mat-label>Baseline for the differences</mat-label>
            <mat-select
              [value]="baseline()"
              (selectionChange)="baseline.set($event.value)"
              data-testid="compare-baseline"
            >
              @for (col of table().columns; track col.scenarioId; let k = $index) {
                <mat-option [value]="k">{{ col.name }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
        </div>
        <div class="tr-table-wrap" tabindex="0" role="region" aria-label="Comparison table, scrolls sideways">
          <table class="compare-table" data-testid="compare-table">
            <thead>
              <tr>
                <th scope="col">Figure</th>
                @for (col of table().columns; track col.scenarioId; let k = $index) {
                  <th scope="col" [class.baseline]="k === baseline()">
                    <a [routerLink]="['/projects', id(), 'scenarios', col.scenarioId]">{{ col.name }}</a>
                    @if (col.frozen) {
                      <mat-icon class="lock" aria-label="frozen">lock</mat-icon>
                    }
                  </th>
                }
              </tr>
            </thead>
            <tbody>
              @for (r of table().rows; track r.key) {
                <tr [attr.data-figure]="r.key">
                  <th scope="row">{{ r.name }}<app-term-info [name]="r.name" [text]="r.explain" /></th>
                  @for (cell of r.cells; track $index) {
                    <td [class.baseline]="$index === baseline()">{{ cell }}</td>
                  }
                </tr>
              }
            </tbody>
            <tbody class="differences" data-testid="compare-differences">
              <tr class="section">
                <th scope="rowgroup" [attr.colspan]="table().columns.length + 1">
                  Against {{ table().columns[baseline()]?.name }}
                </th>
              </tr>
              @for (r of differences(); track r.key) {
                <tr [attr.data-figure]="r.key">
                  <th scope="row">{{ r.name }}</th>
                  @for (cell of r.cells; track $index) {
                    <td [class.baseline]="$index === baseline()">{{ cell }}</td>
                  }
                </tr>
              }
            </tbody>
          </table>
        </div>
        <section class="chart-card" aria-labelledby="compare-chart-title">
          <h2 id="compare-chart-title">Life-cycle cost and unmet hours across the design temperatures</h2>
          <div
            class="chart"
            echarts
            role="img"
            data-testid="compare-chart"
            aria-label="Life-cycle cost and unmet hours per year of each scenario against the design temperature; the table lists the named points"
            [options]="chart()"
          ></div>
        </section>
        <app-tradeoff-cautions />
      }
    </section>
  `,
  styles: `
    .progress {
      display: flex;
      flex-direction: column;
      gap: 0.35rem;
      margin: 0.75rem 0;
      color: var(--mat-sys-on-surface-variant);
    }
    .controls {
      display: flex;
      flex-wrap: wrap;
      gap: 0.75rem 1rem;
      margin-top: 0.75rem;
    }
    .controls mat-form-field {
      /* Wide enough for "The point chosen in each scenario" without an ellipsis, never wider than a phone. */
      min-width: min(22rem, 100%);
    }
    .tr-table-wrap {
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
      tbody th {
        font-weight: 600;
        white-space: nowrap;
      }
      td {
        min-width: 9rem;
      }
      .baseline {
        background: color-mix(in srgb, var(--tr-ink) 6%, transparent);
      }
      .section th {
        background: var(--mat-sys-surface-container-low);
        font: var(--mat-sys-title-small);
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
  private readonly compact = compactScreen();

  protected readonly idList = computed(() =>
    this.ids()
      .split(',')
      .filter((x) => x.length > 0),
  );
  private readonly loaded = resource({
    params: () => ({ projectId: this.id(), ids: this.idList() }),
    loader: ({ params }) => this.api.compare(params.projectId, params.ids),
  });
  protected readonly comparison = computed<Comparison | null>(() =>
    this.loaded.hasValue() ? this.loaded.value() : null,
  );
  protected readonly loading = this.loaded.isLoading;
  protected readonly error = computed(() => {
    const err = this.loaded.error();
    return err ? apiErrorMessage(err, 'The scenarios could not be compared.') : '';
  });
  protected readonly point = signal<ComparePoint>('chosen');
  protected readonly baseline = signal(0);
  protected readonly pointChoices = computed(() => comparePointChoices(this.comparison()?.entries ?? []));
  protected readonly table = computed(() =>
    comparisonTable(this.comparison()?.entries ?? [], this.point(), this.auth.unitSystem()),
  );
  protected readonly differences = computed(() => differenceRows(this.table(), this.baseline()));
  protected readonly chart = computed(() =>
    comparisonChart(
      this.comparison()?.entries.map((e) => ({ name: e.scenario.name, sweep: e.sweep })) ?? [],
      this.auth.unitSystem(),
      this.compact(),
    ),
  );
  protected readonly csvUrl = computed(() => this.api.compareCsvUrl(this.id(), this.idList()));
}
