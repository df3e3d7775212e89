import { ChangeDetectionStrategy, ChangeDetectorRef, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import {
  EQUIPMENT_LIST_NAME_MAX,
  type EquipmentList,
  type EquipmentListSummary,
} from '@shared/equipment/equipment-list-schemas';
import { apiErrorCode, apiErrorMessage, applyApiErrors, fieldError } from '../../core/api-errors';
import { EquipmentApi } from '../equipment-api';

export interface RenameEquipmentListDialogData {
  list: EquipmentListSummary;
}

/** Changes an equipment list's name and closes with the saved list. */
@Component({
  selector: 'app-rename-equipment-list-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>Rename equipment list</h2>
    <form [formGroup]="form" (ngSubmit)="rename()" novalidate>
      <mat-dialog-content>
        @if (formError()) {
          <div class="tr-alert" role="alert">
            <span>{{ formError() }}</span>
            @if (stale()) {
              <button mat-button type="button" [disabled]="pending()" (click)="reload()">Reload</button>
            }
          </div>
        }
        <mat-form-field class="name">
          <mat-label>List name</mat-label>
          <input matInput formControlName="name" cdkFocusInitial autocomplete="off" data-testid="list-name" />
          <mat-error>{{ fieldError(form.controls.name, { required: 'Enter a list name' }) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="pending()">Rename</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .name {
      width: min(400px, 100%);
      padding-top: 0.25rem;
    }

    .tr-alert {
      align-items: center;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RenameEquipmentListDialog {
  // services
  private readonly api = inject(EquipmentApi);
  private readonly dialogRef = inject<MatDialogRef<RenameEquipmentListDialog, EquipmentList>>(MatDialogRef);
  private readonly cdr = inject(ChangeDetectorRef);
  private readonly data = inject<RenameEquipmentListDialogData>(MAT_DIALOG_DATA);

  /** The list as last loaded: its version is the one a rename is made from. */
  private list: EquipmentListSummary = this.data.list;

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.list.name, [Validators.required, Validators.maxLength(EQUIPMENT_LIST_NAME_MAX)]],
  });
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  /** Someone changed the list since it was loaded. */
  protected readonly stale = signal(false);
  protected readonly fieldError = fieldError;

  protected async rename(): Promise<void> {
    if (this.pending()) return;
    const name = this.form.controls.name.value.trim();
    if (!name) this.form.controls.name.setValue('');
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    if (name === this.list.name) {
      this.dialogRef.close();
      return;
    }
    await this.run(async () => {
      this.dialogRef.close(await this.api.rename(this.list.id, this.list.version, name));
    });
  }

  /** Loads the list again; the typed name stays so it can be saved over the latest version. */
  protected async reload(): Promise<void> {
    await this.run(async () => {
      this.list = await this.api.get(this.list.id);
    });
  }

  private async run(action: () => Promise<void>): Promise<void> {
    this.pending.set(true);
    this.formError.set('');
    this.stale.set(false);
    try {
      await action();
    } catch (err) {
      if (apiErrorCode(err) === 'stale_update') {
        this.stale.set(true);
        this.formError.set(apiErrorMessage(err));
      } else {
        this.formError.set(applyApiErrors(this.form, err));
      }
    } finally {
      this.pending.set(false);
      this.cdr.markForCheck();
    }
  }
}
