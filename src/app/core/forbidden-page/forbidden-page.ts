import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

@Component({
  selector: 'app-forbidden-page',
  imports: [MatButtonModule, RouterLink],
  template: `
    <section class="tr-page">
      <h1>Not allowed</h1>
      <p class="tr-lede">
        Your role in this organisation does not allow this page. An owner of the organisation can change your role.
      </p>
      <a mat-flat-button routerLink="/projects">Back to projects</a>
    </section>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ForbiddenPage {}
