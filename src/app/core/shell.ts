import { BreakpointObserver } from '@angular/cdk/layout';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  signal,
  viewChild,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatMenuModule } from '@angular/material/menu';
import { MatSidenav, MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { MatTooltipModule } from '@angular/material/tooltip';
import { NavigationEnd, Router, RouterLink, RouterOutlet } from '@angular/router';
import { filter, map, startWith } from 'rxjs';

import { formatShopDate } from '../../../shared/dates';
import { apiErrorMessage } from './api-error';
import { activeNavPath, NAV_GROUPS, navGroupsFor, type NavGroupId } from './nav-items';
import { Notifier } from './notifier';
import { OfflineStatus } from './offline-status';
import { ROLE_LABELS } from './role-labels';
import { Session } from './session';

/** Where the sections a person folded away are remembered on this device. */
const COLLAPSED_KEY = 'stepstock.nav.collapsed';

function readCollapsed(): NavGroupId[] {
  try {
    const stored: unknown = JSON.parse(localStorage.getItem(COLLAPSED_KEY) ?? '[]');
    return Array.isArray(stored)
      ? stored.filter((id): id is NavGroupId => NAV_GROUPS.some((group) => group.id === id))
      : [];
  } catch {
    return [];
  }
}

/** Below this width (a tablet held upright) the side navigation becomes an overlay. */
const NARROW = '(max-width: 1023.98px)';

/** The frame around every signed-in page: top bar, user menu and the role's navigation. */
@Component({
  selector: 'app-shell',
  imports: [
    MatTooltipModule,
    MatButtonModule,
    MatIconModule,
    MatListModule,
    MatMenuModule,
    MatSidenavModule,
    MatToolbarModule,
    RouterLink,
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
  private readonly offline = inject(OfflineStatus);

  private readonly nav = viewChild.required<MatSidenav>('nav');

  protected readonly overlay = toSignal(
    inject(BreakpointObserver)
      .observe(NARROW)
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  protected readonly groups = computed(() => {
    const user = this.session.user();
    return user ? navGroupsFor(user.role) : [];
  });
  private readonly url = toSignal(
    this.router.events.pipe(
      filter((event) => event instanceof NavigationEnd),
      map(() => this.router.url),
      startWith(this.router.url),
    ),
    { initialValue: this.router.url },
  );
  /** Exactly one entry is highlighted: the most specific one for the page shown. */
  protected readonly activePath = computed(() =>
    activeNavPath(
      this.url(),
      this.groups().flatMap((group) => group.items),
    ),
  );
  private readonly collapsed = signal<NavGroupId[]>(readCollapsed());
  protected readonly roleLabel = computed(() => {
    const user = this.session.user();
    return user ? ROLE_LABELS[user.role] : '';
  });

  /**
   * Said plainly above the page whenever what it shows may be out of date: the network is down,
   * or the server did not answer in time and the service worker showed its copy.
   */
  protected readonly offlineNote = computed(() => {
    const asOf = this.offline.shownAsOf();
    if (asOf) return `Offline — shown as of ${this.timeOf(asOf)}`;
    return this.offline.online()
      ? ''
      : 'Offline — what you type waits here and is sent when the network is back';
  });

  /** "14:05" today, with the day before it when the copy is older. */
  private timeOf(when: Date): string {
    const zone = { timeZone: this.session.timeZone() };
    const day = (d: Date) => new Intl.DateTimeFormat('en-CA', zone).format(d);
    const time = new Intl.DateTimeFormat('en-GB', {
      ...zone,
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    }).format(when);
    return day(when) === day(new Date())
      ? time
      : `${formatShopDate(when, 'date', { locale: this.session.locale(), ...zone })} ${time}`;
  }

  /** A folded section still opens when it holds the page shown, so the highlight is never hidden. */
  protected isCollapsed(id: NavGroupId): boolean {
    if (!this.collapsed().includes(id)) return false;
    const active = this.activePath();
    return !this.groups().some(
      (group) => group.id === id && group.items.some((item) => item.path === active),
    );
  }

  protected toggleGroup(id: NavGroupId): void {
    const folded = this.isCollapsed(id);
    const next = folded
      ? this.collapsed().filter((other) => other !== id)
      : [...this.collapsed().filter((other) => other !== id), id];
    this.collapsed.set(next);
    try {
      localStorage.setItem(COLLAPSED_KEY, JSON.stringify(next));
    } catch {
      /* private mode: the choice lasts only this visit */
    }
  }

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
