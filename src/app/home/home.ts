import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

import { navItemsFor } from '../core/nav-items';
import { ROLE_LABELS, ROLE_SUMMARIES } from '../core/role-labels';
import { Session } from '../core/session';

/** The first page after sign-in: who you are, and a card for each thing your role can open. */
@Component({
  selector: 'app-home',
  imports: [MatCardModule, MatIconModule, RouterLink],
  templateUrl: './home.html',
  styleUrl: './home.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Home {
  private readonly session = inject(Session);

  protected readonly user = this.session.user;
  protected readonly roleLabel = computed(() => {
    const user = this.user();
    return user ? ROLE_LABELS[user.role] : '';
  });
  protected readonly summary = computed(() => {
    const user = this.user();
    return user ? ROLE_SUMMARIES[user.role] : '';
  });
  /** Every entry of the role's navigation except this page itself. */
  protected readonly cards = computed(() => {
    const user = this.user();
    return user ? navItemsFor(user.role).filter((item) => item.path !== '/') : [];
  });
}
