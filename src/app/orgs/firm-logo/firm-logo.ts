import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { firstValueFrom } from 'rxjs';
import { LOGO_MAX_BYTES } from '@shared/reports/report-schemas';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage } from '../../core/api-errors';

/** The firm's logo on client reports: PNG, JPEG or SVG up to 1 MB (owners change it). */
@Component({
  selector: 'app-firm-logo',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <section class="logo-card" aria-labelledby="logo-title" data-testid="firm-logo">
      <h2 id="logo-title">Logo on client reports</h2>
      <div class="row">
        @if (hasLogo()) {
          <img [src]="src()" alt="Current logo" (error)="hasLogo.set(false)" />
        } @else {
          <p class="none">No logo: reports show the organisation's name.</p>
        }
      </div>
      @if (error()) {
        <p class="tr-alert" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon><span>{{ error() }}</span>
        </p>
      }
      @if (canManage()) {
        <div class="tr-actions">
          <label class="upload">
            <input
              type="file"
              accept="image/png,image/jpeg,image/svg+xml,.png,.jpg,.jpeg,.svg"
              (change)="upload($event)"
              [disabled]="pending()"
            />
            <mat-icon>upload</mat-icon><span>Choose a PNG, JPEG or SVG (up to 1 MB)</span>
          </label>
          @if (hasLogo()) {
            <button mat-button type="button" (click)="remove()" [disabled]="pending()">Remove</button>
          }
        </div>
      }
    </section>
  `,
  styles: `
    .logo-card {
      margin-top: 2rem;
      padding: 1rem;
      border: 1px solid var(--tr-rule);
      border-radius: 8px;
    }
    h2 {
      font: var(--mat-sys-title-medium);
      font-weight: 600;
      margin: 0 0 0.5rem;
    }
    img {
      max-height: 64px;
      max-width: 240px;
    }
    .none {
      color: var(--mat-sys-on-surface-variant);
    }
    .upload {
      display: inline-flex;
      align-items: center;
      gap: 0.35rem;
      cursor: pointer;
      border: 1px solid var(--mat-sys-outline);
      border-radius: 20px;
      padding: 0.4rem 1rem;
      input {
        position: absolute;
        width: 1px;
        height: 1px;
        opacity: 0;
      }
      &:focus-within {
        outline: 2px solid var(--tr-ink);
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FirmLogo {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);
  protected readonly canManage = computed(() => this.auth.can('member:manage'));
  /** False until the server says there is a logo, so that a firm without one loads no missing image. */
  protected readonly hasLogo = signal(false);

  constructor() {
    this.http.get<{ hasLogo: boolean }>('/api/v1/organization/logo-status').subscribe({
      next: (s) => {
        this.hasLogo.set(s.hasLogo);
      },
      error: () => undefined,
    });
  }
  protected readonly stamp = signal(Date.now());
  protected readonly src = computed(() => `/api/v1/organization/logo?v=${this.stamp()}`);
  protected readonly pending = signal(false);
  protected readonly error = signal('');

  protected async upload(event: Event): Promise<void> {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    if (file.size > LOGO_MAX_BYTES) {
      this.error.set('The logo must be at most 1 MB');
      return;
    }
    const body = new FormData();
    body.append('logo', file);
    await this.run(async () => {
      await firstValueFrom(this.http.put('/api/v1/organization/logo', body));
      this.hasLogo.set(true);
      this.stamp.set(Date.now());
    });
  }

  protected async remove(): Promise<void> {
    await this.run(async () => {
      await firstValueFrom(this.http.delete('/api/v1/organization/logo'));
      this.hasLogo.set(false);
    });
  }

  private async run(action: () => Promise<void>): Promise<void> {
    this.pending.set(true);
    this.error.set('');
    try {
      await action();
    } catch (err) {
      this.error.set(apiErrorMessage(err, 'The logo could not be saved.'));
    } finally {
      this.pending.set(false);
    }
  }
}
