import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import { RouterLink } from '@angular/router';
import { AuthStore } from '../../auth/auth-store';

/** The centred card that frames signed-out pages: product name, tagline, then the page. */
@Component({
  selector: 'app-auth-card',
  imports: [MatCardModule, RouterLink],
  templateUrl: './auth-card.html',
  styleUrl: './auth-card.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AuthCard {
  // services
  protected readonly auth = inject(AuthStore);

  // inputs
  readonly heading = input.required<string>();
}
