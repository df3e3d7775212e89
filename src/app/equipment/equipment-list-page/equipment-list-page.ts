import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { ReactiveFormsModule, type AbstractControl } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { UnitSystem } from '@shared/units/units';
import {
  EQUIPMENT_OPTIONS_MAX,
  type EquipmentList,
  equipmentKinds,
  type EquipmentKind,
  type EquipmentOption,
} from '@shared/equipment/equipment-schemas';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorCode, apiErrorMessage, fieldError, readApiError } from '../../core/api-errors';
import { VersionedEdit } from '../../core/versioned-edit';
import {
  CsvImportDialog,
  type CsvImportDialogData,
  type CsvImportResult,
} from '../csv-import-dialog/csv-import-dialog';
import { DEFAULT_CURRENCY, EquipmentApi } from '../equipment-api';
import {
  FUEL_LABELS,
  KIND_LABELS,
  OptionRow,
  VALUE_COLUMNS,
  columnHeader,
  ratingPoint,
  displayValue,
  priceHint,
  type ValueColumn,
} from '../equipment-rows';
import { SafetyNote } from '../safety-note';

const SERVER_PATH = /^options\.(\d+)\.(\w+)/;

/** `/equipment-lists/:id`: the options of a list, edited in place and saved together. */
@Component({
  selector: 'app-equipment-list-page',
  imports: [
    DatePipe,
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
    SafetyNote,
  ],
  templateUrl: './equipment-list-page.html',
  styleUrl: './equipment-list-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EquipmentListPage {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly api = inject(EquipmentApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  /** Route parameter. */
  readonly id = input.required<string>();

  protected readonly loaded = this.api.listResource(() => this.id());
  protected readonly notFound = computed(() => apiErrorCode(this.loaded.error()) === 'not_found');
  private readonly prices = this.api.energyPricesResource();
  protected readonly currency = computed(
    () => (this.prices.hasValue() ? this.prices.value().prices?.currency : undefined) ?? DEFAULT_CURRENCY,
  );
  protected readonly canWrite = computed(() => this.auth.can('project:write'));
  protected readonly units = computed(() => this.auth.unitSystem());
  protected readonly lowRatingPoint = computed(() => ratingPoint('low', this.units()));

  protected readonly rows = signal<readonly OptionRow[]>([]);
  /** Saves the table over the list's version; after someone else saved, loads theirs on request. */
  protected readonly edit = new VersionedEdit<EquipmentList>({
    load: (list) => this.api.get(list.id),
    placeErrors: (e) => this.placeServerErrors(e),
  });
  /** The list as last loaded or saved; a save is made from its version. */
  protected readonly list = this.edit.record;
  /** The table differs from the saved list. */
  protected readonly changed = signal(false);
  /** The user kept their changes over a newer saved list: saving replaces it. */
  protected readonly overriding = signal(false);

  protected readonly kinds = equipmentKinds.map((value) => ({ value, label: KIND_LABELS[value] }));
  protected readonly fuels = (['gas', 'oil', 'propane'] as const).map((value) => ({
    value,
    label: FUEL_LABELS[value],
  }));
  protected readonly valueColumns = VALUE_COLUMNS;
  protected readonly editColumns = ['kind', 'label', 'fuel', ...VALUE_COLUMNS.map((c) => c.field), 'remove'];
  protected readonly readColumns = ['kind', 'label', 'fuel', ...VALUE_COLUMNS.map((c) => c.field)];
  protected readonly csvUrl = computed(() => this.api.csvUrl(this.id()));
  protected readonly maxOptions = EQUIPMENT_OPTIONS_MAX;
  protected readonly trackRow = (_: number, row: OptionRow) => row.key;
  protected readonly priceHint = priceHint;

  /** The unit system the typed powers are in. */
  private shownUnits: UnitSystem = this.auth.unitSystem();

  constructor() {
    effect(() => {
      if (!this.loaded.hasValue()) return;
      const list = this.loaded.value();
      untracked(() => this.show(list));
    });
    effect(() => {
      const units = this.units();
      untracked(() => {
        for (const row of this.rows()) row.changeUnits(this.shownUnits, units);
        this.shownUnits = units;
      });
    });
  }

  protected header(column: ValueColumn): string {
    return columnHeader(column, this.units(), this.currency());
  }

  protected applies(column: ValueColumn, kind: EquipmentKind): boolean {
    return column.kinds.includes(kind);
  }

  protected display(column: ValueColumn, option: EquipmentOption): string {
    return displayValue(column, option, this.units(), this.currency());
  }

  protected kindLabel(o: EquipmentOption): string {
    return KIND_LABELS[o.kind];
  }

  protected fuelLabel(o: EquipmentOption): string {
    return FUEL_LABELS[o.fuel];
  }

  protected cellError(control: AbstractControl): string {
    return fieldError(control);
  }

  protected addRow(): void {
    this.rows.update((rows) => [...rows, this.newRow(null)]);
    this.changed.set(true);
  }

  protected removeRow(row: OptionRow): void {
    this.rows.update((rows) => rows.filter((r) => r !== row));
    this.changed.set(true);
  }

  /** Puts the table back to the list as saved. */
  protected discard(): void {
    const list = this.list();
    if (list) this.show(list);
  }

  protected async save(): Promise<void> {
    if (!this.list() || this.edit.isPending() || !this.canWrite()) return;
    this.edit.clear();
    const options: EquipmentOption[] = [];
    const problems: string[] = [];
    let rowsWithProblems = 0;
    this.rows().forEach((row, index) => {
      const result = row.check(this.units());
      if (result.ok) {
        options.push(result.option);
        return;
      }
      rowsWithProblems++;
      for (const issue of result.issues) {
        if (!row.markError(issue.field, issue.message)) problems.push(`Row ${index + 1}: ${issue.message}`);
      }
    });
    if (rowsWithProblems > 0) {
      const rows = rowsWithProblems === 1 ? '1 row needs' : `${rowsWithProblems} rows need`;
      this.edit.refuse(
        [`${rows} attention before the list can be saved; the messages are under the cells.`, ...problems].join(' '),
      );
      return;
    }
    if (options.length > EQUIPMENT_OPTIONS_MAX) {
      this.edit.refuse(`A list holds at most ${EQUIPMENT_OPTIONS_MAX} options; remove some rows first.`);
      return;
    }
    const saved = await this.edit.save((base) => this.api.saveOptions(base.id, base.version, options));
    if (!saved) return;
    this.show(saved);
    this.snackBar.open('Equipment list saved', 'Close', { duration: 4000 });
  }

  /** After a refused save: shows the list as saved now, dropping the changes made here. */
  protected async loadLatest(): Promise<void> {
    const latest = await this.edit.reload();
    if (latest) this.show(latest);
  }

  /** After a refused save: keeps the table as edited here, so that saving replaces the newer list. */
  protected async keepMine(): Promise<void> {
    if (await this.edit.reload()) this.overriding.set(true);
  }

  protected async openImport(): Promise<void> {
    const list = this.list();
    if (!list) return;
    const data: CsvImportDialogData = {
      listId: list.id,
      unitSystem: this.units(),
      currency: this.currency(),
      rowCount: this.rows().length,
      maxOptions: EQUIPMENT_OPTIONS_MAX,
    };
    const result = await firstValueFrom(
      this.dialog
        .open<CsvImportDialog, CsvImportDialogData, CsvImportResult>(CsvImportDialog, { data, maxWidth: '960px' })
        .afterClosed(),
    );
    if (!result) return;
    const imported = result.options.map((o) => this.newRow(o));
    this.rows.update((rows) => (result.mode === 'replace' ? imported : [...rows, ...imported]));
    this.changed.set(true);
    const n = imported.length === 1 ? '1 option' : `${imported.length} options`;
    const done = result.mode === 'replace' ? `The table now holds the ${n} from the file` : `${n} added to the table`;
    this.snackBar.open(`${done}. Save changes to keep them.`, 'Close', { duration: 6000 });
  }

  private newRow(option: EquipmentOption | null): OptionRow {
    return new OptionRow(option, this.shownUnits, () => this.changed.set(true));
  }

  private show(list: EquipmentList): void {
    this.list.set(list);
    this.rows.set(list.options.map((o) => this.newRow(o)));
    this.changed.set(false);
    this.overriding.set(false);
    this.edit.clear();
  }

  /** Puts each `options.N.field` detail of a refused save under its cell; returns the message for the rest. */
  private placeServerErrors(err: unknown): string {
    const body = readApiError(err);
    if (!body) return apiErrorMessage(err);
    const unplaced: string[] = [];
    const rows = this.rows();
    for (const detail of body.details ?? []) {
      const match = SERVER_PATH.exec(detail.path);
      const row = match ? rows[Number(match[1])] : undefined;
      if (row && match?.[2] && row.markError(match[2], detail.message)) continue;
      const where = match ? `Row ${Number(match[1]) + 1}: ` : '';
      if (detail.message !== body.message) unplaced.push(where + detail.message);
    }
    return [body.message, ...unplaced].join(' ');
  }
}
