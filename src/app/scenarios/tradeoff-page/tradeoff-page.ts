import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatDialog } from '@angular/material/dialog';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSliderModule } from '@angular/material/slider';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { ECElementEvent, ECharts } from 'echarts/core';
import { NgxEchartsDirective } from 'ngx-echarts';
import { firstValueFrom } from 'rxjs';
import type { FieldIssue } from '@shared/api/api-error';
import { SCENARIO_NAME_MAX, type Scenario, type SweepAnswer } from '@shared/scenarios/scenario-schemas';
import { formatMoney } from '@shared/money/money';
import { applyDesignRule } from '@shared/sweep/design-rule';
import {
  bandSentence,
  comfortSentence,
  oddsBasisSentence,
  oddsSentence,
  type OddsContext,
} from '@shared/sweep/odds-words';
import { designValueName, explain, gridStepText, term, type TermKey } from '@shared/glossary/glossary';
import { GRID_STEP_C } from '@shared/sweep/sweep';
import { formatQuantity } from '@shared/units/units';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage, readApiError } from '../../core/api-errors';
import { VersionedEdit } from '../../core/versioned-edit';
import { provideCharts } from '../../charts/provide-charts';
import { NameDialog, type NameDialogData } from '../../ui/name-dialog/name-dialog';
import { ScenarioSettingsPanel } from '../scenario-settings/scenario-settings';
import { ScenariosApi } from '../scenarios-api';
import { loadDurationChart, tradeoffChart } from '../tradeoff-charts';
import {
  defaultIndex,
  designRows,
  formatPower,
  loadDurationTable,
  nearestIndex,
  optionLabelOf,
  sentenceFor,
  tradeoffChartSummary,
  rulesText,
} from '../tradeoff-text';
import { ReportList } from '../../reports/report-list/report-list';
import { TermInfo } from '../../ui/term-info/term-info';
import { TradeoffCautions } from './tradeoff-cautions';
import { compactScreen } from '../../core/compact-screen';

/** `/projects/:id/scenarios/:scenarioId`: one scenario's sweep, the chosen design point, and its settings. */
@Component({
  selector: 'app-tradeoff-page',
  imports: [
    DatePipe,
    RouterLink,
    NgxEchartsDirective,
    MatButtonModule,
    MatChipsModule,
    MatExpansionModule,
    MatIconModule,
    MatProgressBarModule,
    MatSlideToggleModule,
    MatSliderModule,
    ScenarioSettingsPanel,
    TradeoffCautions,
    ReportList,
    TermInfo,
  ],
  providers: [provideCharts()],
  templateUrl: './tradeoff-page.html',
  styleUrl: './tradeoff-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TradeoffPage {
  /** Route parameters. */
  readonly id = input.required<string>();
  readonly scenarioId = input.required<string>();

  private readonly api = inject(ScenariosApi);
  private readonly auth = inject(AuthStore);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);

  protected readonly compact = compactScreen();
  protected readonly unitSystem = this.auth.unitSystem;
  protected readonly canWrite = computed(() => this.auth.can('project:write'));

  protected readonly scenario = signal<Scenario | null>(null);
  protected readonly loadError = signal('');
  protected readonly sweep = signal<SweepAnswer | null>(null);
  protected readonly sweeping = signal(false);
  protected readonly sweepError = signal('');
  protected readonly sweepProblems = signal<FieldIssue[]>([]);
  protected readonly index = signal(0);
  protected readonly showGrid = signal(false);

  protected readonly canEdit = computed(() => this.canWrite() && this.scenario()?.frozenAt === null);
  protected readonly rows = computed(() => {
    const s = this.sweep();
    return s ? designRows(s, this.unitSystem()) : [];
  });
  protected readonly tableRows = computed(() => {
    const i = this.index();
    return this.rows().filter((r) => this.showGrid() || !r.isGrid || r.index === i);
  });
  protected readonly chosen = computed(() => this.rows()[this.index()] ?? null);
  protected readonly chosenRow = computed(() => this.sweep()?.rows[this.index()] ?? null);
  protected readonly sentence = computed(() => {
    const s = this.sweep();
    return s ? sentenceFor(s, this.index(), this.unitSystem()) : '';
  });
  private readonly oddsContext = computed((): OddsContext | null => {
    const s = this.sweep();
    return s
      ? { rows: s.rows, currency: s.currency, unitSystem: this.unitSystem(), odds: s.odds, uncertainty: s.uncertainty }
      : null;
  });
  protected readonly oddsText = computed(() => {
    const ctx = this.oddsContext();
    return ctx ? oddsSentence(this.index(), ctx) : '';
  });
  protected readonly oddsBasis = computed(() => oddsBasisSentence(this.sweep()?.odds ?? null));
  protected readonly comfortText = computed(() => {
    const ctx = this.oddsContext();
    return ctx ? comfortSentence(this.index(), ctx) : '';
  });
  protected readonly bandText = computed(() => {
    const ctx = this.oddsContext();
    return ctx ? bandSentence(this.index(), ctx) : '';
  });
  /** The design point the scenario's stated rule picks, and why (null: no rule stated). */
  protected readonly rulePick = computed(() => {
    const rule = this.scenario()?.settings.rule ?? null;
    const s = this.sweep();
    return rule && s ? applyDesignRule(s.rows, rule) : null;
  });
  protected readonly chartOptions = computed(() => {
    const s = this.sweep();
    return s ? tradeoffChart(s, this.index(), this.unitSystem(), this.compact(), this.rulePick()?.index ?? null) : null;
  });
  protected readonly chartSummary = computed(() => {
    const s = this.sweep();
    return s ? tradeoffChartSummary(s, this.unitSystem()) : '';
  });
  protected readonly durationOptions = computed(() => {
    const s = this.sweep();
    return s ? loadDurationChart(s, this.index(), this.unitSystem(), this.compact()) : null;
  });
  protected readonly durationRows = computed(() => {
    const s = this.sweep();
    return s ? loadDurationTable(s, this.index(), this.unitSystem()) : [];
  });
  protected readonly sliderMax = computed(() => Math.max(0, (this.sweep()?.rows.length ?? 1) - 1));
  protected readonly sliderText = computed(() => this.designPointText(this.index()));
  protected readonly capacityText = computed(() => {
    const r = this.chosenRow();
    return r?.capacityAtDesignW == null ? '—' : formatPower(r.capacityAtDesignW, this.unitSystem());
  });
  protected readonly csvUrl = computed(() => this.api.sweepCsvUrl(this.id(), this.scenarioId()));
  protected readonly lifeCycleNote = computed(() => {
    const s = this.sweep();
    const r = this.chosenRow();
    if (!s || !r?.selectedOptionId) return '';
    const o = s.options.find((x) => x.id === r.selectedOptionId);
    if (!o) return '';
    return s.studyPeriodYears === null
      ? `${o.lifeYears}-year life at ${s.discountRatePct} % real discount rate`
      : `over a ${s.studyPeriodYears}-year study period (unit life ${o.lifeYears} years) at ${s.discountRatePct} % real discount rate`;
  });
  protected readonly rules = computed(() => {
    const s = this.sweep();
    return s ? rulesText(s) : [];
  });
  protected readonly windText = computed(() => formatQuantity('speed', this.sweep()?.designWindMs, this.unitSystem()));
  protected readonly gridStepLabel = computed(() => gridStepText(GRID_STEP_C, this.unitSystem()));
  protected readonly terms = { designTemperatures: term('designTemperatures') };
  protected readonly explainDesignTemperatures = explain('designTemperatures');
  /** The table's columns, named and explained from the glossary. */
  protected readonly columns = (
    [
      ['designPoint', 'Design point'],
      ['designLoad', 'Design load'],
      ['unit', 'Unit'],
      ['compressorAtDesign', 'Compressor'],
      ['installedPrice', 'Installed'],
      ['annualCost', 'Running / yr'],
      ['lifeCycleCost', 'Life-cycle'],
      ['runHours', 'Full-load h / yr'],
      ['backupHours', 'Backup h / yr'],
      ['backupEnergy', 'Backup kWh / yr'],
      ['unmetHours', 'Unmet h / yr'],
      ['unmetHoursWorstYear', 'Unmet h, worst year'],
      ['unmetDegreeHours', 'Unmet degree-h / yr'],
      ['lowestIndoor', 'Lowest indoor'],
    ] as const satisfies readonly (readonly [TermKey, string])[]
  ).map(([key, name]) => ({ key, name, explain: explain(key) }));
  /** The chosen point's figures, named and explained from the glossary. */
  protected readonly figures = computed(() => {
    const c = this.chosen();
    if (!c) return [];
    const f = (key: TermKey, value: string, extra: { lead?: boolean; testId?: string; note?: string } = {}) => ({
      key,
      name: term(key),
      explain: explain(key),
      value,
      lead: extra.lead ?? false,
      testId: extra.testId ?? null,
      note: extra.note ?? '',
    });
    const heatPump = c.compressor !== '—';
    return [
      f('designTemperature', this.sliderText(), { lead: true, testId: 'chosen-temperature' }),
      f('designLoad', c.designLoad),
      f('unit', c.unit, { lead: true, testId: 'chosen-unit' }),
      ...(heatPump ? [f('compressorAtDesign', c.compressor, { lead: true, testId: 'chosen-compressor' })] : []),
      f('capacityAtDesign', this.capacityText()),
      f('installedPrice', c.installedPrice, { testId: 'chosen-price' }),
      f('annualCost', c.annualCost),
      f('lifeCycleCost', c.lifeCycleCost, { note: this.lifeCycleNote(), testId: 'chosen-lcc' }),
      f('runHours', c.runHours),
      ...(heatPump
        ? [
            f('backupHours', c.backupHours, { testId: 'chosen-backup-hours' }),
            f('backupEnergy', c.backupEnergy, { testId: 'chosen-backup-energy' }),
          ]
        : []),
      f('unmetHours', c.unmetHours, { testId: 'chosen-unmet' }),
      f('unmetHoursWorstYear', c.unmetWorst),
      f('unmetDegreeHours', c.degreeHours),
      f('lowestIndoor', c.lowestIndoor, {
        testId: 'chosen-lowest-indoor',
        note: c.drop === '—' ? '' : `${c.drop} below the set-point`,
      }),
    ];
  });
  protected readonly optionLabel = computed(() => {
    const s = this.sweep();
    return s ? optionLabelOf(s) : (id: string) => id;
  });

  private chart: ECharts | null = null;
  private dragging = false;

  constructor() {
    effect(() => {
      const projectId = this.id();
      const scenarioId = this.scenarioId();
      untracked(() => void this.load(projectId, scenarioId));
    });
  }

  protected async load(projectId = this.id(), scenarioId = this.scenarioId()): Promise<void> {
    this.loadError.set('');
    try {
      const s = await this.api.get(projectId, scenarioId);
      // Another scenario (a frozen copy just made, say) starts from its own saved design point.
      if (this.scenario()?.id !== s.id) this.sweep.set(null);
      this.scenario.set(s);
      await this.runSweep();
    } catch (err) {
      this.loadError.set(
        readApiError(err)?.code === 'not_found'
          ? 'This scenario was not found. It may have been deleted, or it belongs to another organisation.'
          : apiErrorMessage(err, 'The scenario could not be loaded.'),
      );
    }
  }

  /** Runs the sweep (the server answers from its cache when nothing changed); the page stays usable meanwhile. */
  protected async runSweep(): Promise<void> {
    const s = this.scenario();
    if (!s) return;
    this.sweeping.set(true);
    this.sweepError.set('');
    this.sweepProblems.set([]);
    try {
      const answer = await this.api.sweep(s.projectId, s.id);
      const previous = this.chosenRow()?.designC ?? s.chosenDesignC;
      this.sweep.set(answer);
      this.index.set(previous === null ? defaultIndex(answer.rows) : nearestIndex(answer.rows, previous));
    } catch (err) {
      const e = readApiError(err);
      this.sweep.set(null);
      this.sweepError.set(apiErrorMessage(err, 'The sweep could not be run.'));
      this.sweepProblems.set(e?.code === 'scenario_incomplete' ? (e.details ?? []) : []);
    } finally {
      this.sweeping.set(false);
    }
  }

  protected settingsSaved(s: Scenario): void {
    this.scenario.set(s);
    void this.runSweep();
  }

  protected selectRulePick(): void {
    const i = this.rulePick()?.index;
    if (typeof i === 'number') this.select(i);
  }

  protected select(index: number): void {
    const max = this.sliderMax();
    this.index.set(Math.min(max, Math.max(0, Math.round(index))));
    this.scheduleSaveChoice();
  }

  private saveTimer: ReturnType<typeof setTimeout> | null = null;

  /** Keeps the chosen design point with the scenario (after the user pauses), so a reload or a freeze finds it. */
  private scheduleSaveChoice(): void {
    if (!this.canEdit()) return;
    if (this.saveTimer !== null) clearTimeout(this.saveTimer);
    this.saveTimer = setTimeout(() => {
      this.saveTimer = null;
      void this.saveChoice();
    }, 500);
  }

  private saving: Promise<void> = Promise.resolve();
  /**
   * Saves the chosen design point over the scenario's version. Keeping the newer version (and the
   * names) needs no new sweep: nothing the sweep reads changed. When someone saved the scenario
   * meanwhile, theirs is taken and this choice saved on top of it.
   */
  private readonly choiceEdit = new VersionedEdit<Scenario>({
    record: this.scenario,
    load: (s) => this.api.get(s.projectId, s.id),
    placeErrors: (e) => apiErrorMessage(e, 'The chosen design point could not be saved.'),
  });

  private saveChoice(): Promise<void> {
    this.saving = this.saving.then(async () => {
      const s = this.scenario();
      const designC = this.chosenRow()?.designC;
      if (!s || designC === undefined || s.chosenDesignC === designC || s.frozenAt) return;
      const saved = await this.choiceEdit.saveOverLatest((base) =>
        this.api.update(base.projectId, base.id, { version: base.version, chosenDesignC: designC }),
      );
      if (!saved && !this.choiceEdit.isStale()) {
        this.snack.open(this.choiceEdit.error(), 'Dismiss', { duration: 6000 });
      }
    });
    return this.saving;
  }

  protected onChartInit(chart: ECharts): void {
    this.chart = chart;
    const zr = chart.getZr();
    const pick = (e: { offsetX: number; offsetY: number }) => {
      const s = this.sweep();
      if (!s || !chart.containPixel('grid', [e.offsetX, e.offsetY])) return;
      const [xValue] = chart.convertFromPixel('grid', [e.offsetX, e.offsetY]) as [number, number];
      const c = this.unitSystem() === 'SI' ? xValue : ((xValue - 32) * 5) / 9;
      this.select(nearestIndex(s.rows, c));
    };
    zr.on('mousedown', (e) => {
      this.dragging = true;
      pick(e);
    });
    zr.on('mousemove', (e) => {
      if (this.dragging) pick(e);
    });
    zr.on('mouseup', () => (this.dragging = false));
    zr.on('globalout', () => (this.dragging = false));
  }

  protected onChartClick(e: ECElementEvent): void {
    if (typeof e.dataIndex === 'number' && e.componentType === 'series') this.select(e.dataIndex);
  }

  protected money(v: string | null): string {
    const s = this.sweep();
    return v === null || !s ? '—' : formatMoney(v, s.currency);
  }

  protected async freeze(): Promise<void> {
    const s = this.scenario();
    if (!s) return;
    const data: NameDialogData<Scenario> = {
      title: 'Freeze for a bid',
      label: 'Name of the frozen copy',
      initial: `${s.name} · bid ${new Date().toISOString().slice(0, 10)}`,
      submitLabel: 'Freeze',
      maxLength: SCENARIO_NAME_MAX,
      hint: 'A dated copy keeps today’s inputs, prices and results. It can be read, compared and copied, but never changed.',
      save: async (name) => {
        // The frozen copy carries the chosen design point: save a pending choice first.
        if (this.saveTimer !== null) {
          clearTimeout(this.saveTimer);
          this.saveTimer = null;
        }
        await this.saveChoice();
        return this.api.freeze(s.projectId, s.id, name);
      },
    };
    const frozen = await firstValueFrom(
      this.dialog.open<NameDialog<Scenario>, NameDialogData<Scenario>, Scenario>(NameDialog, { data }).afterClosed(),
    );
    if (frozen) {
      await this.router.navigate(['/projects', s.projectId, 'scenarios', frozen.id]);
      this.snack
        .open(
          `Frozen as “${frozen.name}”. This is the frozen copy; the live scenario stays editable.`,
          'Back to the live one',
          { duration: 8000 },
        )
        .onAction()
        .subscribe(() => void this.router.navigate(['/projects', s.projectId, 'scenarios', s.id]));
    }
  }

  /** The other climate basis for the one-click comparison: the latest 15 years, or the whole record. */
  protected readonly otherBasis = computed(() => {
    const a = this.sweep();
    const s = this.scenario();
    if (!a?.hasRecord || !s) return null;
    const recent = s.settings.climateBasisYears;
    if (recent === null) return a.years.length > 15 ? { years: 15, label: 'Compare with the latest 15 years' } : null;
    return { years: null, label: 'Compare with the whole record' };
  });

  /** Makes a copy that differs only in its climate basis and opens both side by side. */
  protected async compareBasis(): Promise<void> {
    const s = this.scenario();
    const other = this.otherBasis();
    if (!s || !other) return;
    try {
      const name = other.years === null ? `${s.name} · whole record` : `${s.name} · latest ${other.years} years`;
      const copy = await this.api.duplicate(s.projectId, s.id, name.slice(0, SCENARIO_NAME_MAX));
      const changed = await this.api.update(s.projectId, copy.id, {
        version: copy.version,
        settings: { ...copy.settings, climateBasisYears: other.years },
      });
      await this.router.navigate(['/projects', s.projectId, 'compare'], {
        queryParams: { ids: `${s.id},${changed.id}` },
      });
    } catch (err) {
      this.snack.open(apiErrorMessage(err), 'Dismiss', { duration: 8000 });
    }
  }

  protected async copyFrozen(): Promise<void> {
    const s = this.scenario();
    if (!s) return;
    try {
      const copy = await this.api.duplicate(s.projectId, s.id);
      await this.router.navigate(['/projects', s.projectId, 'scenarios', copy.id]);
    } catch (err) {
      this.snack.open(apiErrorMessage(err), 'Dismiss', { duration: 8000 });
    }
  }

  protected readonly temperature = (c: number) => formatQuantity('temperature', c, this.unitSystem());
  /**
   * The design point at a slider position as the page shows it, e.g. "−32.5 °C (50-year return period)". The slider
   * uses it both for its bubble and for the value a screen reader reads out, so the two never differ.
   */
  protected readonly designPointText = (i: number): string => {
    const r = this.sweep()?.rows[i];
    return r
      ? `${formatQuantity('temperature', r.designC, this.unitSystem())}${r.isGrid ? '' : ` (${designValueName(r.label)})`}`
      : '';
  };
}
