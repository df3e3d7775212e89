import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { SIZING_CAUTIONS, SIZING_CAUTIONS_TITLE } from '@shared/reports/cautions';

/** The trade's cautions beside any sizing result that leaves hours short. */
@Component({
  selector: 'app-tradeoff-cautions',
  imports: [MatIconModule],
  template: `
    <section class="cautions" aria-labelledby="cautions-title" data-testid="tradeoff-cautions">
      <h2 id="cautions-title"><mat-icon aria-hidden="true">warning</mat-icon>{{ title }}</h2>
      <ul>
        @for (c of cautions; track c) {
          <li>{{ c }}</li>
        }
      </ul>
    </section>
  `,
  styles: `
    .cautions {
      margin-top: 1.5rem;
      padding: 0.75rem 1rem;
      border-left: 4px solid var(--tr-ember);
      background: color-mix(in srgb, var(--tr-ember) 7%, var(--mat-sys-surface));
      border-radius: 4px;
    }
    h2 {
      display: flex;
      align-items: center;
      gap: 0.5rem;
      margin: 0 0 0.5rem;
      font: var(--mat-sys-title-medium);
    }
    ul {
      margin: 0;
      padding-left: 1.25rem;
    }
    li + li {
      margin-top: 0.35rem;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TradeoffCautions {
  protected readonly title = SIZING_CAUTIONS_TITLE;
  protected readonly cautions = SIZING_CAUTIONS;
}
