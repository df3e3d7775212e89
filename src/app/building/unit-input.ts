import { Directive, ElementRef, Renderer2, effect, forwardRef, inject, input } from '@angular/core';
import { type ControlValueAccessor, NG_VALUE_ACCESSOR } from '@angular/forms';
import type { UnitSystem } from '@shared/units/units';
import { type FieldUnit, displayText, fromDisplay } from './building-units';

/**
 * A number input whose form control holds the SI value while the field shows and takes the value in
 * the user's units. Switching units re-writes the text from the stored SI value, so the value never
 * drifts; typing converts the typed number to SI.
 *
 * `<input matInput type="number" [appUnitInput]="unit.quantity('power')" [unitSystem]="system" [formControl]="c">`
 */
@Directive({
  selector: 'input[appUnitInput]',
  providers: [{ provide: NG_VALUE_ACCESSOR, useExisting: forwardRef(() => UnitInput), multi: true }],
  host: { '(input)': 'typed()', '(blur)': 'touched()' },
})
export class UnitInput implements ControlValueAccessor {
  // services
  private readonly el = inject<ElementRef<HTMLInputElement>>(ElementRef);
  private readonly renderer = inject(Renderer2);

  readonly appUnitInput = input.required<FieldUnit>();
  readonly unitSystem = input.required<UnitSystem>();

  /** The SI value last written or typed. */
  private si: number | null = null;
  private onChange: (value: number | null) => void = () => undefined;
  private onTouched: () => void = () => undefined;

  constructor() {
    // A change of units (or of the field's unit) shows the stored SI value again; the control is untouched.
    effect(() => {
      const fieldUnit = this.appUnitInput();
      const system = this.unitSystem();
      this.render(fieldUnit, system);
    });
  }

  writeValue(value: unknown): void {
    this.si = typeof value === 'number' && Number.isFinite(value) ? value : null;
    this.render(this.appUnitInput(), this.unitSystem());
  }

  registerOnChange(fn: (value: number | null) => void): void {
    this.onChange = fn;
  }

  registerOnTouched(fn: () => void): void {
    this.onTouched = fn;
  }

  setDisabledState(disabled: boolean): void {
    this.renderer.setProperty(this.el.nativeElement, 'disabled', disabled);
  }

  protected typed(): void {
    const text = this.el.nativeElement.value.trim();
    const shown = text === '' ? Number.NaN : Number(text);
    this.si = Number.isFinite(shown) ? fromDisplay(this.appUnitInput(), shown, this.unitSystem()) : null;
    this.onChange(this.si);
  }

  protected touched(): void {
    this.onTouched();
  }

  private render(fieldUnit: FieldUnit, system: UnitSystem): void {
    const text = this.si === null ? '' : displayText(fieldUnit, this.si, system);
    this.renderer.setProperty(this.el.nativeElement, 'value', text);
  }
}
