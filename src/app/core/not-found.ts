import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** Shown inside the shell for an address that leads nowhere (an old bookmark, a typo). */
@Component({
  selector: 'app-not-found',
  imports: [MatButtonModule, RouterLink],
  template: `
    <section class="page">
      <h1>Nothing at this address</h1>
      <p>The page may have moved, or the address has a typo.</p>
      <a mat-flat-button routerLink="/">Back to home</a>
    </section>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NotFound {}
