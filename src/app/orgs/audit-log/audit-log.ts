import { httpResource } from '@angular/common/http';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed } from '@angular/core';
import { auditLogSchema } from '@shared/orgs/org-schemas';

const LABELS: Record<string, string> = {
  account_created: 'Created the organisation’s account',
  member_joined: 'Joined the organisation',
  password_reset: 'Reset their password',
  sign_in: 'Signed in',
  sign_in_failed: 'Failed sign-in',
  sign_out_everywhere: 'Signed out everywhere',
  role_changed: 'Changed a role',
  member_removed: 'Removed a member',
  invitation_created: 'Invited someone',
  invitation_revoked: 'Revoked an invitation',
  plan_changed: 'Plan changed',
  report_link_created: 'Shared a report link',
  report_link_revoked: 'Withdrew a report link',
  report_sent: 'E-mailed a report',
};

/** The organisation's security log (owners). */
@Component({
  selector: 'app-audit-log',
  imports: [DatePipe],
  template: `
    <section class="audit" aria-labelledby="audit-title" data-testid="audit-log">
      <h2 id="audit-title">Security log</h2>
      @if (entries().length === 0) {
        <p class="none">Nothing recorded yet.</p>
      } @else {
        <ul>
          @for (e of entries(); track e.id) {
            <li>
              <strong>{{ label(e.type) }}</strong>
              @if (change(e); as c) {
                <span class="change">{{ c }}</span>
              }
              · {{ e.who }} · <span class="when">{{ e.at | date: 'medium' }}</span>
              @if (e.ip) {
                <span class="ip"> · {{ e.ip }}</span>
              }
            </li>
          }
        </ul>
      }
    </section>
  `,
  styles: `
    .audit {
      margin-top: 2rem;
    }
    h2 {
      font: var(--mat-sys-title-medium);
      font-weight: 600;
      margin: 0 0 0.5rem;
    }
    ul {
      list-style: none;
      padding: 0;
      max-height: 22rem;
      overflow: auto;
      border: 1px solid var(--tr-rule);
      border-radius: 8px;
    }
    li {
      padding: 0.35rem 0.75rem;
      border-bottom: 1px solid var(--tr-rule);
    }
    .when,
    .ip,
    .none {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AuditLog {
  private readonly log = httpResource(() => '/api/v1/audit', { parse: auditLogSchema.parse });
  protected readonly entries = computed(() => (this.log.hasValue() ? this.log.value() : []));
  /** Reads the log again (after a change on the page that it records). */
  reload(): void {
    this.log.reload();
  }

  /** "from Starter to Crew" for a plan change (the detail records "starter active" → "crew active"). */
  protected change(e: { type: string; detail: unknown }): string {
    if (e.type !== 'plan_changed' || typeof e.detail !== 'object' || e.detail === null) return '';
    const d = e.detail as { from?: unknown; to?: unknown };
    const plan = (v: unknown) => {
      if (typeof v !== 'string') return '?';
      const [name = '', status = ''] = v.split(' ');
      const title = name.charAt(0).toUpperCase() + name.slice(1);
      return status && status !== 'active' ? `${title} (${status.replace(/_/g, ' ')})` : title;
    };
    return `from ${plan(d.from)} to ${plan(d.to)}`;
  }

  protected label(type: string): string {
    return LABELS[type] ?? type;
  }
}
