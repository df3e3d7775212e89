import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** The trade's cautions beside any sizing result that leaves hours short. */
@Component({
  selector: 'app-tradeoff-cautions',
  imports: [MatIconModule],
  template: `
    <section class="cautions" aria-labelledby="cautions-title" data-testid="tradeoff-cautions">
      <h2 id="cautions-title"><mat-icon aria-hidden="true">warning</mat-icon>Before you size below the coldest point</h2>
      <ul>
        <li>
          Unmet hours come from the past record; a colder spell than any in it can happen. A unit sized below the
          coldest design point will fall behind in such a spell, and the house will cool.
        </li>
        <li>
          Where pipes could freeze (exterior walls, crawlspaces, unheated rooms, a vacant house) or occupants are
          vulnerable (infants, elderly or ill people), size for the colder design temperature or keep reliable backup or
          supplementary heat.
        </li>
        <li>
          Combustion equipment must be installed, vented and supplied with combustion air by qualified people; fit carbon
          monoxide alarms. Never use ovens, grills or unvented heaters for space heating in a cold snap.
        </li>
        <li>
          These are whole-building estimates for comparing options, not a room-by-room load calculation. Local codes,
          the manufacturer's data and a licensed professional govern the final design.
        </li>
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
export class TradeoffCautions {}
