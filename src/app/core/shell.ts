import { BreakpointObserver } from '@angular/cdk/layout';
import { ChangeDetectionStrategy, Component, computed, inject, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatMenuModule } from '@angular/material/menu';
import { MatSidenav, MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';

import { apiErrorMessage } from './api-error';
import { navItemsFor } from './nav-items';
import { Notifier } from './notifier';
import { ROLE_LABELS } from './role-labels';
import { Session } from './session';

/** Below this width (a tablet held upright) the side navigation becomes an overlay. */
const NARROW = '(max-width: 1023.98px)';

/** The frame around every signed-in page: top bar, user menu and the role's navigation. */
@Component({
  selector: 'app-shell',
  imports: [
    MatButtonModule,
    MatIconModule,
    MatListModule,
    MatMenuModule,
    MatSidenavModule,
    MatToolbarModule,
    RouterLink,
    RouterLinkActive,
    RouterOutlet,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Shell {
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);
  protected readonly session = inject(Session);

  private readonly nav = viewChild.required<MatSidenav>('nav');

  protected readonly overlay = toSignal(
    inject(BreakpointObserver)
      .observe(NARROW)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  protected readonly items = computed(() => {
    const user = this.session.user();
    return user ? navItemsFor(user.role) : [];
  });
  protected readonly roleLabel = computed(() => {
    const user = this.session.user();
    return user ? ROLE_LABELS[user.role] : '';
  });

  protected toggleNav(): void {
    void this.nav().toggle();
  }

  /** In overlay mode a chosen link should reveal its page, not leave the menu over it. */
  protected afterNavigate(): void {
    if (this.overlay()) {
      void this.nav().close();
    }
  }

  protected signOut(): void {
    this.session.signOut().subscribe({
      next: () => void this.router.navigateByUrl('/sign-in'),
      error: (error: unknown) => this.notifier.error(apiErrorMessage(error)),
    });
  }
}
