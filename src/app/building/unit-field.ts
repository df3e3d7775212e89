import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { type FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import type { UnitSystem } from '@shared/units/units';
import { buildingFieldError } from './building-form';
import { type FieldUnit, displayUnit } from './building-units';
import { UnitInput } from './unit-input';

/**
 * A labelled number field in the user's units (the control holds SI), with the unit as suffix, an
 * optional hint and the control's error: the building section's one kind of field.
 *
 * `<app-unit-field label="Heated volume" [control]="c" [unit]="units.volumeM3" [system]="system()" />`
 */
@Component({
  selector: 'app-unit-field',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, UnitInput],
  template: `
    <mat-form-field>
      <mat-label>{{ label() }}</mat-label>
      <input
        matInput
        type="number"
        step="any"
        [formControl]="control()"
        [appUnitInput]="unit()"
        [unitSystem]="system()"
      />
      @if (unitText()) {
        <span matTextSuffix>{{ unitText() }}</span>
      }
      @if (hint()) {
        <mat-hint>{{ hint() }}</mat-hint>
      }
      <mat-error>{{ error() }}</mat-error>
    </mat-form-field>
  `,
  styles: `
    :host {
      display: block;
      min-width: 0;
    }
    mat-form-field {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UnitField {
  // inputs
  readonly label = input.required<string>();
  readonly control = input.required<FormControl<number | null>>();
  readonly unit = input.required<FieldUnit>();
  readonly system = input.required<UnitSystem>();
  readonly hint = input<string>();

  protected readonly unitText = computed(() => displayUnit(this.unit(), this.system()));

  protected error(): string {
    return buildingFieldError(this.control());
  }
}
