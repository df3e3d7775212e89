import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import type { FieldIssue } from '@shared/api/api-error';
import { unitLabel, type UnitSystem } from '@shared/units/units';
import { EQUIPMENT_CSV_MAX_CHARS, type EquipmentOption } from '@shared/equipment/equipment-schemas';
import { formatMoney } from '@shared/money/money';
import { apiErrorMessage, readApiError } from '../../core/api-errors';
import { EquipmentApi } from '../equipment-api';
import { FUEL_LABELS, KIND_LABELS, formatPowerNumber, percentText, ratingPoint } from '../equipment-rows';

export interface CsvImportDialogData {
  listId: string;
  unitSystem: UnitSystem;
  currency: string;
  /** How many options the table holds now (an import may add to them). */
  rowCount: number;
  /** The most options a list may hold. */
  maxOptions: number;
}

export interface CsvImportResult {
  mode: 'append' | 'replace';
  options: EquipmentOption[];
}

type Stage = 'choose' | 'checking' | 'preview' | 'refused';

/**
 * Reads a CSV of equipment options (chosen or pasted), has the server check it without storing
 * anything, and shows the options it holds or every bad line. Closes with the options to add to
 * the table or to replace it with; nothing is saved until the list is saved.
 */
@Component({
  selector: 'app-csv-import-dialog',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatTableModule,
  ],
  templateUrl: './csv-import-dialog.html',
  styleUrl: './csv-import-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CsvImportDialog {
  // services
  private readonly api = inject(EquipmentApi);
  private readonly dialogRef = inject<MatDialogRef<CsvImportDialog, CsvImportResult>>(MatDialogRef);
  protected readonly data = inject<CsvImportDialogData>(MAT_DIALOG_DATA);

  protected readonly csv = inject(NonNullableFormBuilder).control('');
  protected readonly stage = signal<Stage>('choose');
  protected readonly fileName = signal('');
  protected readonly error = signal('');
  protected readonly problems = signal<readonly FieldIssue[]>([]);
  protected readonly options = signal<readonly EquipmentOption[]>([]);
  protected readonly powerUnit = unitLabel('power', this.data.unitSystem);
  protected readonly columns = ['kind', 'label', 'fuel', 'rating', 'installedPrice', 'lifeYears'];
  /** Adding would take the list past its limit. */
  protected readonly tooManyToAdd = computed(() => this.data.rowCount + this.options().length > this.data.maxOptions);
  protected readonly count = computed(() => {
    const n = this.options().length;
    return n === 1 ? '1 option' : `${n} options`;
  });

  protected async onFile(event: Event): Promise<void> {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    this.error.set('');
    if (file.size > EQUIPMENT_CSV_MAX_CHARS * 4) {
      this.error.set('This file is too large for an equipment list.');
      return;
    }
    this.fileName.set(file.name);
    this.csv.setValue(await file.text());
  }

  protected async preview(): Promise<void> {
    if (this.stage() === 'checking') return;
    const csv = this.csv.value;
    if (csv.trim() === '') {
      this.error.set('Paste or choose a CSV file.');
      return;
    }
    if (csv.length > EQUIPMENT_CSV_MAX_CHARS) {
      this.error.set('This file is too large for an equipment list.');
      return;
    }
    this.error.set('');
    this.stage.set('checking');
    try {
      this.options.set(await this.api.previewCsv(this.data.listId, csv));
      this.stage.set('preview');
    } catch (err) {
      const body = readApiError(err);
      if (body?.details?.length) {
        this.error.set(body.message);
        this.problems.set(body.details);
        this.stage.set('refused');
      } else {
        this.error.set(apiErrorMessage(err));
        this.stage.set('choose');
      }
    }
  }

  protected back(): void {
    this.problems.set([]);
    this.options.set([]);
    this.error.set('');
    this.stage.set('choose');
  }

  protected finish(mode: CsvImportResult['mode']): void {
    this.dialogRef.close({ mode, options: [...this.options()] });
  }

  protected where(problem: FieldIssue): string {
    return problem.path ? problem.path.charAt(0).toUpperCase() + problem.path.slice(1) : 'The file';
  }

  protected rating(o: EquipmentOption): string {
    const p = (w: number) => `${formatPowerNumber(w, this.data.unitSystem)} ${this.powerUnit}`;
    const system = this.data.unitSystem;
    if (o.kind === 'heat-pump')
      return `${p(o.capacity8_3W)} at ${ratingPoint('H1', system)}, ${p(o.capacityM8_3W)} at ${ratingPoint('H3', system)}`;
    const efficiency = o.kind === 'electric' ? '' : `, efficiency ${percentText(o.efficiency)} %`;
    if (o.outputW !== undefined) return `${p(o.outputW)} output${efficiency}`;
    return `${o.inputW === undefined ? '—' : p(o.inputW)} input${efficiency}`;
  }

  protected kindLabel(o: EquipmentOption): string {
    return KIND_LABELS[o.kind];
  }

  protected fuelLabel(o: EquipmentOption): string {
    return FUEL_LABELS[o.fuel];
  }

  protected price(o: EquipmentOption): string {
    return formatMoney(o.installedPrice, this.data.currency);
  }
}
