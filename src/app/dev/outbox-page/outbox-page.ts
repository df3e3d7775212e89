import { httpResource } from '@angular/common/http';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { outboxMessageListSchema } from '@shared/orgs/org-schemas';
import { AuthStore } from '../../auth/auth-store';

/** The e-mails the server would have sent, for development only. */
@Component({
  selector: 'app-outbox-page',
  imports: [DatePipe, RouterLink, MatButtonModule, MatCardModule, MatIconModule, MatProgressBarModule],
  templateUrl: './outbox-page.html',
  styleUrl: './outbox-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class OutboxPage {
  // services
  protected readonly auth = inject(AuthStore);

  protected readonly messages = httpResource(() => (this.auth.devOutbox() ? '/api/v1/dev/outbox' : undefined), {
    parse: outboxMessageListSchema.parse,
  });
}
