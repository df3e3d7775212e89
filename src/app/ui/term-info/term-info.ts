import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatTooltipModule } from '@angular/material/tooltip';

/**
 * A small info button beside a figure's name: its one-line explanation shows on hover and on
 * keyboard focus (Material tooltip), and screen readers hear it as the button's description.
 */
@Component({
  selector: 'app-term-info',
  imports: [MatIconModule, MatTooltipModule],
  template: `<button
    type="button"
    class="term-info"
    [matTooltip]="text()"
    matTooltipPosition="above"
    [attr.aria-label]="'About ' + name()"
    data-testid="term-info"
  >
    <mat-icon aria-hidden="true">info</mat-icon>
  </button>`,
  styles: `
    :host {
      display: inline-flex;
      vertical-align: middle;
    }
    .term-info {
      display: inline-flex;
      align-items: center;
      justify-content: center;
      width: 24px;
      height: 24px;
      padding: 0;
      margin-left: 0.15rem;
      border: 0;
      border-radius: 50%;
      background: transparent;
      color: var(--mat-sys-on-surface-variant);
      cursor: help;
    }
    .term-info:focus-visible {
      outline: 2px solid var(--mat-sys-primary);
      outline-offset: 1px;
    }
    mat-icon {
      font-size: 18px;
      width: 18px;
      height: 18px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TermInfo {
  /** The figure's name as shown beside the button. */
  readonly name = input.required<string>();
  /** Its one-line explanation. */
  readonly text = input.required<string>();
}
