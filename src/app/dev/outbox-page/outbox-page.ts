import { HttpErrorResponse, httpResource } from '@angular/common/http';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { DEV_OUTBOX_TOKEN_HEADER } from '@shared/api/dev-outbox';
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

  private readonly route = inject(ActivatedRoute);

  /** The development token from the link printed at start (`?token=`), kept for this tab. */
  private readonly token = rememberedToken(this.route.snapshot.queryParamMap.get('token'));

  protected readonly messages = httpResource(
    () => (this.auth.devOutbox() ? { url: '/api/v1/dev/outbox', headers: tokenHeaders(this.token) } : undefined),
    { parse: outboxMessageListSchema.parse },
  );

  /** 401: neither signed in nor opened with the token. */
  protected readonly needsAccess = computed(() => {
    const err = this.messages.error();
    return err instanceof HttpErrorResponse && err.status === 401;
  });
}

const TOKEN_KEY = 'tailroom.devOutboxToken';

function tokenHeaders(token: string | null): Record<string, string> {
  const headers: Record<string, string> = {};
  if (token) headers[DEV_OUTBOX_TOKEN_HEADER] = token;
  return headers;
}

function rememberedToken(fromLink: string | null): string | null {
  try {
    if (fromLink) sessionStorage.setItem(TOKEN_KEY, fromLink);
    return fromLink ?? sessionStorage.getItem(TOKEN_KEY);
  } catch {
    return fromLink; // storage refused (private mode): the link's token for this visit only
  }
}
