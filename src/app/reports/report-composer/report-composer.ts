import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import {
  REPORT_NOTE_MAX,
  REPORT_PHONE_MAX,
  REPORT_POINTS_MAX,
  REPORT_TITLE_MAX,
  reportFigureKeys,
  reportFigureDesignerLabels,
  type Report,
  type ReportFigure,
} from '@shared/reports/report-schemas';
import type { SweepAnswer } from '@shared/scenarios/scenario-schemas';
import { designValueName } from '@shared/glossary/glossary';
import { formatQuantity, type UnitSystem } from '@shared/units/units';
import { applyApiErrors, fieldError } from '../../core/api-errors';
import { ReportsApi } from '../reports-api';

export interface ReportComposerData {
  projectId: string;
  scenarioId: string;
  scenarioName: string;
  /** The report's default title comes from the project (never the internal scenario name). */
  defaultTitle: string;
  sweep: SweepAnswer;
  /** The design point chosen on the trade-off screen (°C). */
  chosenC: number;
  unitSystem: UnitSystem;
}

/** Picks the design points, figures, units and note of a client report; closes with the created report. */
@Component({
  selector: 'app-report-composer',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatRadioModule,
  ],
  templateUrl: './report-composer.html',
  styles: `
    .field {
      width: 100%;
    }
    fieldset {
      border: 1px solid var(--tr-rule);
      border-radius: 8px;
      margin: 0 0 0.75rem;
      padding: 0.25rem 0.75rem 0.5rem;
    }
    legend {
      font-weight: 600;
    }
    .hint {
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
      font-size: 0.9rem;
    }
    .choices {
      display: flex;
      flex-direction: column;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReportComposer {
  protected readonly data = inject<ReportComposerData>(MAT_DIALOG_DATA);
  private readonly api = inject(ReportsApi);
  private readonly dialogRef = inject<MatDialogRef<ReportComposer, Report>>(MatDialogRef);
  protected readonly form = inject(NonNullableFormBuilder).group({
    title: [
      this.data.defaultTitle.slice(0, REPORT_TITLE_MAX),
      [Validators.required, Validators.maxLength(REPORT_TITLE_MAX)],
    ],
    note: ['', Validators.maxLength(REPORT_NOTE_MAX)],
    contactPhone: ['', Validators.maxLength(REPORT_PHONE_MAX)],
    unitSystem: this.data.unitSystem,
  });
  protected readonly pointsMax = REPORT_POINTS_MAX;
  /** Named design values, plus the chosen point when it lies between them. */
  protected readonly designPoints = computed(() =>
    this.data.sweep.rows
      .filter((r) => !r.isGrid || r.designC === this.data.chosenC)
      .map((r) => ({
        designC: r.designC,
        text: `${r.isGrid ? 'Chosen point' : designValueName(r.label)}: ${formatQuantity('temperature', r.designC, this.data.unitSystem)}`,
      })),
  );
  protected readonly points = signal<ReadonlySet<number>>(this.defaultPoints());
  protected readonly figures = signal<ReadonlySet<ReportFigure>>(new Set(reportFigureKeys));
  protected readonly figureKeys = reportFigureKeys;
  protected readonly figureLabels = reportFigureDesignerLabels;
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  protected readonly fieldError = fieldError;

  private defaultPoints(): Set<number> {
    const rows = this.data.sweep.rows;
    const coldest = rows
      .filter((r) => !r.isGrid)
      .reduce<number | null>((m, r) => (m === null || r.designC < m ? r.designC : m), null);
    const set = new Set<number>([this.data.chosenC]);
    if (coldest !== null) set.add(coldest);
    return set;
  }

  protected togglePoint(t: number, on: boolean): void {
    const next = new Set(this.points());
    if (on) next.add(t);
    else next.delete(t);
    this.points.set(next);
  }

  protected toggleFigure(k: ReportFigure, on: boolean): void {
    const next = new Set(this.figures());
    if (on) next.add(k);
    else next.delete(k);
    this.figures.set(next);
  }

  protected async create(): Promise<void> {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const points = [...this.points()].sort((a, b) => b - a);
    if (points.length < 1 || points.length > REPORT_POINTS_MAX) {
      this.formError.set(`Choose one to ${REPORT_POINTS_MAX} design points to present`);
      return;
    }
    if (this.figures().size === 0) {
      this.formError.set('Choose at least one figure to show');
      return;
    }
    const v = this.form.getRawValue();
    this.pending.set(true);
    this.formError.set('');
    try {
      const report = await this.api.create(this.data.projectId, {
        scenarioId: this.data.scenarioId,
        title: v.title.trim(),
        note: v.note,
        contactPhone: v.contactPhone.trim(),
        points,
        figures: reportFigureKeys.filter((k) => this.figures().has(k)),
        unitSystem: v.unitSystem,
      });
      this.dialogRef.close(report);
    } catch (err) {
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
    }
  }
}
