import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** The one line of safety advice shown wherever equipment is chosen. */
@Component({
  selector: 'app-safety-note',
  imports: [MatIconModule],
  template: `
    <p class="tr-note" role="note" data-testid="safety-note">
      <mat-icon aria-hidden="true">warning</mat-icon>
      <span
        >Combustion equipment must be installed and vented by qualified people; capacities come from the manufacturer’s
        data, which governs.</span
      >
    </p>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SafetyNote {}
