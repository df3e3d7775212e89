import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import {
  EQUIPMENT_LIST_NAME_MAX,
  type EquipmentList,
  type EquipmentListSummary,
} from '@shared/equipment/equipment-schemas';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage } from '../../core/api-errors';
import { ConfirmDialog, type ConfirmDialogData } from '../../ui/confirm-dialog/confirm-dialog';
import { EnergyPricesForm } from '../energy-prices-form/energy-prices-form';
import { EquipmentApi } from '../equipment-api';
import { NameDialog, type NameDialogData } from '../../ui/name-dialog/name-dialog';
import { SafetyNote } from '../safety-note';

/** `/equipment-lists`: the organisation's equipment lists, and its energy prices. */
@Component({
  selector: 'app-equipment-lists-page',
  imports: [
    DatePipe,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatProgressBarModule,
    MatTableModule,
    EnergyPricesForm,
    SafetyNote,
  ],
  templateUrl: './equipment-lists-page.html',
  styleUrl: './equipment-lists-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EquipmentListsPage {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly api = inject(EquipmentApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  protected readonly lists = this.api.listsResource();
  protected readonly rows = computed<EquipmentListSummary[]>(() => (this.lists.hasValue() ? this.lists.value() : []));
  protected readonly canWrite = computed(() => this.auth.can('project:write'));
  protected readonly columns = computed(() => {
    const columns = ['name', 'optionCount', 'updatedAt'];
    return this.canWrite() ? [...columns, 'actions'] : columns;
  });
  /** List ids with a change in flight. */
  protected readonly busy = signal<ReadonlySet<string>>(new Set());

  protected isBusy(id: string): boolean {
    return this.busy().has(id);
  }

  protected async openNewList(): Promise<void> {
    const data: NameDialogData<EquipmentList> = {
      title: 'New equipment list',
      label: 'List name',
      initial: '',
      submitLabel: 'Create list',
      maxLength: EQUIPMENT_LIST_NAME_MAX,
      fieldHint: 'For example “Gas furnaces 2026” or “Cold-climate heat pumps”',
      requiredMessage: 'Enter a list name',
      testId: 'list-name',
      save: (name) => this.api.create(name),
    };
    const created = await firstValueFrom(
      this.dialog
        .open<NameDialog<EquipmentList>, NameDialogData<EquipmentList>, EquipmentList>(NameDialog, { data })
        .afterClosed(),
    );
    if (!created) return;
    this.snackBar.open(`Equipment list “${created.name}” created`, 'Close', { duration: 4000 });
    await this.router.navigate(['/equipment-lists', created.id]);
  }

  protected async rename(list: EquipmentListSummary): Promise<void> {
    const data: NameDialogData<EquipmentList, EquipmentListSummary> = {
      title: 'Rename equipment list',
      label: 'List name',
      initial: list.name,
      submitLabel: 'Rename',
      maxLength: EQUIPMENT_LIST_NAME_MAX,
      requiredMessage: 'Enter a list name',
      testId: 'list-name',
      closeIfUnchanged: true,
      save: (name, _choice, current) => this.api.rename(list.id, (current ?? list).version, name),
      versioned: { record: list, load: (l) => this.api.get(l.id) },
    };
    const renamed = await firstValueFrom(
      this.dialog
        .open<NameDialog<EquipmentList, EquipmentListSummary>, typeof data, EquipmentList>(NameDialog, {
          data,
          autoFocus: 'first-tabbable',
        })
        .afterClosed(),
    );
    if (!renamed) return;
    this.snackBar.open(`Equipment list renamed to “${renamed.name}”`, 'Close', { duration: 4000 });
    this.lists.reload();
  }

  protected async remove(list: EquipmentListSummary): Promise<void> {
    const count = list.optionCount === 1 ? '1 option' : `${list.optionCount} options`;
    const data: ConfirmDialogData = {
      title: `Delete ${list.name}?`,
      message: `The list and its ${count} will be deleted. This cannot be undone.`,
      confirmLabel: 'Delete',
    };
    const confirmed = await firstValueFrom(
      this.dialog.open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data }).afterClosed(),
    );
    if (!confirmed) return;
    this.busy.update((s) => new Set(s).add(list.id));
    try {
      await this.api.remove(list.id);
      this.snackBar.open(`Equipment list “${list.name}” deleted`, 'Close', { duration: 4000 });
    } catch (err) {
      this.snackBar.open(apiErrorMessage(err), 'Close', { duration: 8000 });
    } finally {
      this.busy.update((s) => {
        const next = new Set(s);
        next.delete(list.id);
        return next;
      });
      this.lists.reload();
    }
  }
}
