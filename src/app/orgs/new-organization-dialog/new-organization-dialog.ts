import { ChangeDetectionStrategy, ChangeDetectorRef, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { ORGANIZATION_NAME_MAX_LENGTH } from '@shared/auth/auth-schemas';
import { AuthStore } from '../../auth/auth-store';
import { applyApiErrors, fieldError } from '../../core/api-errors';

/** Creates an organisation owned by the user and switches to it; closes with true when done. */
@Component({
  selector: 'app-new-organization-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>New organisation</h2>
    <form [formGroup]="form" (ngSubmit)="create()" novalidate>
      <mat-dialog-content>
        <p class="intro">You will be its owner, and Tailroom switches to it.</p>
        @if (formError()) {
          <p class="tr-alert" role="alert">{{ formError() }}</p>
        }
        <mat-form-field class="name">
          <mat-label>Organisation name</mat-label>
          <input matInput formControlName="name" autocomplete="organization" />
          <mat-error>{{ fieldError(form.controls.name, { required: 'Enter a name' }) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="pending()">Create organisation</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .name {
      width: min(360px, 100%);
    }
    .intro {
      margin-top: 0;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewOrganizationDialog {
  // services
  private readonly auth = inject(AuthStore);
  private readonly dialogRef = inject<MatDialogRef<NewOrganizationDialog, boolean>>(MatDialogRef);
  private readonly cdr = inject(ChangeDetectorRef);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(ORGANIZATION_NAME_MAX_LENGTH)]],
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
      await this.auth.createOrganization(name);
      this.dialogRef.close(true);
    } catch (err) {
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
      this.cdr.markForCheck();
    }
  }
}
