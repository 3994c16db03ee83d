import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { catchError, map, of, startWith } from 'rxjs';

import { ShopDatePipe } from '../core/shop-date-pipe';
import {
  HOME_SECTIONS_BY_ROLE,
  type HomeAlertJson,
  type HomeJobJson,
  type HomeJson,
  type HomeListJson,
  type HomeOrderJson,
  type HomeSection,
} from '../../../shared/api/home';
import { JOB_STATE_LABELS } from '../../../shared/api/jobs';
import { ORDER_STATE_LABELS } from '../../../shared/api/purchasing';
import { apiErrorMessage } from '../core/api-error';
import { ROLE_LABELS, ROLE_SUMMARIES } from '../core/role-labels';
import { Session } from '../core/session';
import { HomeApi } from './home-api';

type Loaded =
  { state: 'loading' } | { state: 'ok'; home: HomeJson } | { state: 'error'; message: string };

/** How each section reads: its heading, what an empty one says, and the page with all of it. */
const SECTION_TEXT: Record<
  HomeSection,
  { title: string; icon: string; empty: string; all: string; link: string; query?: object }
> = {
  dueToday: {
    title: 'Due today',
    icon: 'event',
    empty: 'Nothing is due today, and nothing is overdue.',
    all: 'Open the job bench',
    link: '/jobs',
  },
  waitingForParts: {
    title: 'Waiting for parts',
    icon: 'hourglass_top',
    empty: 'No job is waiting for a piston or a ring set.',
    all: 'Open the job bench',
    link: '/jobs',
  },
  waitingForApproval: {
    title: 'Waiting for the customer’s approval',
    icon: 'request_quote',
    empty: 'No estimate is waiting for an answer.',
    all: 'Open the job bench',
    link: '/jobs',
  },
  alerts: {
    title: 'Stock alerts',
    icon: 'notifications',
    empty: 'No stock alert is waiting to be seen.',
    all: 'Open stock alerts',
    link: '/alerts',
  },
  ordersArriving: {
    title: 'Orders on the way',
    icon: 'local_shipping',
    empty: 'No order is on the way.',
    all: 'Open purchase orders',
    link: '/purchasing/orders',
  },
};

interface Section {
  id: HomeSection;
  title: string;
  icon: string;
  empty: string;
  all: string;
  link: string;
  total: number;
  jobs: HomeJobJson[];
  alerts: HomeAlertJson[];
  orders: HomeOrderJson[];
}

/** The first page after sign-in: the day's work for the person's role, each list linking on. */
@Component({
  selector: 'app-home',
  imports: [ShopDatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './home.html',
  styleUrl: './home.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Home {
  private readonly session = inject(Session);
  private readonly api = inject(HomeApi);

  protected readonly user = this.session.user;
  protected readonly jobStates = JOB_STATE_LABELS;
  protected readonly orderStates = ORDER_STATE_LABELS;
  protected readonly roleLabel = computed(() => {
    const user = this.user();
    return user ? ROLE_LABELS[user.role] : '';
  });
  protected readonly summary = computed(() => {
    const user = this.user();
    return user ? ROLE_SUMMARIES[user.role] : '';
  });

  protected readonly loaded = toSignal(
    this.api.summary().pipe(
      map((home): Loaded => ({ state: 'ok', home })),
      catchError((error: unknown) =>
        of<Loaded>({ state: 'error', message: apiErrorMessage(error) }),
      ),
      startWith<Loaded>({ state: 'loading' }),
    ),
    { initialValue: { state: 'loading' } as Loaded },
  );

  protected readonly loadError = computed(() => {
    const loaded = this.loaded();
    return loaded.state === 'error' ? loaded.message : null;
  });

  /** The role's sections in order, each with what the server listed for it. */
  protected readonly sections = computed((): Section[] => {
    const user = this.user();
    const loaded = this.loaded();
    if (!user || loaded.state !== 'ok') return [];
    return HOME_SECTIONS_BY_ROLE[user.role].flatMap((id) => {
      const list = loaded.home[id] as HomeListJson<unknown> | undefined;
      if (!list) return [];
      const items = list.items;
      return [
        {
          id,
          ...SECTION_TEXT[id],
          total: list.total,
          jobs: id === 'alerts' || id === 'ordersArriving' ? [] : (items as HomeJobJson[]),
          alerts: id === 'alerts' ? (items as HomeAlertJson[]) : [],
          orders: id === 'ordersArriving' ? (items as HomeOrderJson[]) : [],
        },
      ];
    });
  });
}
