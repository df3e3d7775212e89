import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import {
  nFactorFor,
  nFactorShieldings,
  nFactorStoreys,
  nFactorZones,
  type NFactorShielding,
  type NFactorStoreys,
  type NFactorZone,
} from '@shared/building/heat-loss';

const ZONE_LABELS: Record<NFactorZone, string> = {
  1: 'Zone 1 (windiest, coldest)',
  2: 'Zone 2',
  3: 'Zone 3',
  4: 'Zone 4 (calmest, mildest)',
};

const SHIELDING_LABELS: Record<NFactorShielding, string> = {
  'well-shielded': 'Well shielded',
  normal: 'Normal',
  exposed: 'Exposed',
};

/** Picks the n-factor that turns a blower-door ACH50 into natural air changes, from its table. */
@Component({
  selector: 'app-n-factor-picker',
  imports: [MatButtonModule, MatFormFieldModule, MatSelectModule],
  template: `
    <div class="picker" data-testid="n-factor-picker">
      <p class="intro">Pick the n-factor from the table by climate zone, storeys and shielding:</p>
      <div class="selects">
        <mat-form-field subscriptSizing="dynamic">
          <mat-label>Climate zone</mat-label>
          <mat-select [value]="zone()" (valueChange)="zone.set($event)" [disabled]="disabled()">
            @for (z of zones; track z) {
              <mat-option [value]="z">{{ zoneLabels[z] }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
        <mat-form-field subscriptSizing="dynamic">
          <mat-label>Storeys</mat-label>
          <mat-select [value]="storeys()" (valueChange)="storeys.set($event)" [disabled]="disabled()">
            @for (s of storeyChoices; track s) {
              <mat-option [value]="s">{{ s }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
        <mat-form-field subscriptSizing="dynamic">
          <mat-label>Shielding</mat-label>
          <mat-select [value]="shielding()" (valueChange)="shielding.set($event)" [disabled]="disabled()">
            @for (s of shieldings; track s) {
              <mat-option [value]="s">{{ shieldingLabels[s] }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
      </div>
      <div class="result">
        <span
          >Table value: <strong data-testid="n-factor-table-value">{{ value() }}</strong></span
        >
        @if (!disabled()) {
          <button mat-stroked-button type="button" (click)="picked.emit(value())">Use this n-factor</button>
        }
      </div>
      <p class="source">
        Source: LBL n-factor method, Sherman (1987), “Estimation of infiltration from leakage and climate indicators”,
        Energy and Buildings 10, 81–86. Table values are a zone value (15.5, 18.5, 21.5, 24.5) times a storey factor
        (1.0, 0.9, 0.8, 0.7) times a shielding factor (1.2, 1.0, 0.9); check them against the publication before relying
        on them. Without other information an n-factor of 20 is a common rule of thumb.
      </p>
    </div>
  `,
  styles: `
    .picker {
      border: 1px dashed var(--tr-rule);
      border-radius: 8px;
      padding: 0.5rem 0.75rem;
      margin: 0 0 0.75rem;
    }

    .intro,
    .source {
      margin: 0 0 0.5rem;
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }

    .selects {
      display: grid;
      grid-template-columns: repeat(auto-fit, minmax(11rem, 1fr));
      gap: 0.5rem;
    }

    .result {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 0.75rem;
      margin: 0.5rem 0;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NFactorPicker {
  readonly disabled = input(false);
  readonly picked = output<number>();

  protected readonly zones = nFactorZones;
  protected readonly storeyChoices = nFactorStoreys;
  protected readonly shieldings = nFactorShieldings;
  protected readonly zoneLabels = ZONE_LABELS;
  protected readonly shieldingLabels = SHIELDING_LABELS;

  protected readonly zone = signal<NFactorZone>(2);
  protected readonly storeys = signal<NFactorStoreys>(2);
  protected readonly shielding = signal<NFactorShielding>('normal');
  protected readonly value = computed(() => nFactorFor(this.zone(), this.storeys(), this.shielding()));
}
