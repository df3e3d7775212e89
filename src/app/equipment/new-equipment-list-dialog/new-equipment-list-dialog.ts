import { ChangeDetectionStrategy, ChangeDetectorRef, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { EQUIPMENT_LIST_NAME_MAX, type EquipmentList } from '@shared/equipment/equipment-list-schemas';
import { applyApiErrors, fieldError } from '../../core/api-errors';
import { EquipmentApi } from '../equipment-api';

/** Asks for a name, creates an empty equipment list and closes with it. */
@Component({
  selector: 'app-new-equipment-list-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>New equipment list</h2>
    <form [formGroup]="form" (ngSubmit)="create()" novalidate>
      <mat-dialog-content>
        @if (formError()) {
          <p class="tr-alert" role="alert">{{ formError() }}</p>
        }
        <mat-form-field class="name">
          <mat-label>List name</mat-label>
          <input matInput formControlName="name" cdkFocusInitial autocomplete="off" data-testid="list-name" />
          <mat-hint>For example “Gas furnaces 2026” or “Cold-climate heat pumps”</mat-hint>
          <mat-error>{{ fieldError(form.controls.name, { required: 'Enter a list name' }) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="pending()">Create list</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .name {
      width: min(400px, 100%);
      padding-top: 0.25rem;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewEquipmentListDialog {
  // services
  private readonly api = inject(EquipmentApi);
  private readonly dialogRef = inject<MatDialogRef<NewEquipmentListDialog, EquipmentList>>(MatDialogRef);
  private readonly cdr = inject(ChangeDetectorRef);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(EQUIPMENT_LIST_NAME_MAX)]],
  });
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  protected readonly fieldError = fieldError;

  protected async create(): Promise<void> {
    if (this.pending()) return;
    const name = this.form.controls.name.value.trim();
    if (!name) this.form.controls.name.setValue('');
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.formError.set('');
    try {
      this.dialogRef.close(await this.api.create(name));
    } catch (err) {
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
      this.cdr.markForCheck();
    }
  }
}
