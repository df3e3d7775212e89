import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

@Component({
  selector: 'app-not-found-page',
  imports: [MatButtonModule, RouterLink],
  template: `
    <section class="tr-page">
      <h1>Page not found</h1>
      <p class="tr-lede">There is no page at this address. Check the link, or start again from your projects.</p>
      <a mat-flat-button routerLink="/projects">Back to projects</a>
    </section>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotFoundPage {}
