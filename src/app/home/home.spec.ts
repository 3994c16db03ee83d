import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

import type { HomeJobJson, HomeJson } from '../../../shared/api/home';
import type { Role } from '../../../shared/session-types';
import { Session } from '../core/session';
import { Home } from './home';

function job(n: number, extra: Partial<HomeJobJson> = {}): HomeJobJson {
  return {
    id: `job-${n}`,
    number: `J-26${String(n).padStart(4, '0')}`,
    state: 'gauged',
    customerName: `Customer ${n}`,
    familyCode: 'KT-2',
    dueDate: '2026-12-03',
    overdue: false,
    ...extra,
  };
}

describe('Home', () => {
  let http: HttpTestingController;

  async function render(role: Role, body: HomeJson | 'fail') {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    const loading = TestBed.inject(Session).load();
    http.expectOne('/api/session').flush({
      user: { id: 'u1', email: 'p@example.test', name: 'Pell Marrow', role, unit: 'mm' },
      shop: { name: 'Gorse Lane Bore Works' },
    });
    await loading;
    const fixture = TestBed.createComponent(Home);
    fixture.detectChanges();
    const request = http.expectOne('/api/home');
    if (body === 'fail')
      request.flush(
        { error: { code: 'unavailable', message: 'The database is not answering.' } },
        { status: 503, statusText: 'Unavailable' },
      );
    else request.flush(body);
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  function headings(element: HTMLElement): string[] {
    return Array.from(element.querySelectorAll('.panel h2 .panel-title')).map(
      (h) => h.textContent?.trim() ?? '',
    );
  }

  afterEach(() => http.verify());

  it('when a machinist opens home, then the day’s jobs show in their sections, not a grid of links', async () => {
    const element = await render('machinist', {
      today: '2026-12-03',
      dueToday: {
        total: 7,
        items: [job(1, { dueDate: '2026-12-01', overdue: true }), job(2), job(3), job(4), job(5)],
      },
      waitingForParts: { total: 1, items: [job(6, { dueDate: null, state: 'parts_set_aside' })] },
      waitingForApproval: { total: 0, items: [] },
    });
    expect(headings(element)).toEqual([
      'Due today',
      'Waiting for parts',
      'Waiting for the customer’s approval',
    ]);
    const due = element.querySelector('[aria-labelledby="home-dueToday"]')!;
    expect(due.querySelector('.count')?.textContent?.trim()).toBe('7');
    const first = due.querySelector('a.item')!;
    expect(first.getAttribute('href')).toBe('/jobs/job-1');
    expect(first.textContent).toContain('J-260001');
    expect(first.textContent).toContain('Overdue since Tue 01/12/2026');
    expect(due.querySelectorAll('a.item')).toHaveLength(5);
    expect(due.querySelector('.more')?.textContent?.replace(/\s+/g, ' ').trim()).toBe('and 2 more');
    const parts = element.querySelector('[aria-labelledby="home-waitingForParts"]')!;
    expect(parts.textContent).toContain('Parts set aside');
    const approval = element.querySelector('[aria-labelledby="home-waitingForApproval"]')!;
    expect(approval.querySelector('.empty')?.textContent).toContain('No estimate is waiting');
    // The old home repeated the navigation as cards; the day's work replaces it.
    expect(element.querySelector('.cards')).toBeNull();
    expect(element.textContent).not.toContain('Where to go');
  });

  it('when a buyer opens home, then alerts and orders on the way show, a late order marked late', async () => {
    const element = await render('buyer', {
      today: '2026-12-03',
      waitingForParts: { total: 0, items: [] },
      alerts: {
        total: 1,
        items: [
          {
            id: 'a1',
            partId: 'p1',
            sku: 'RS-KT2-040',
            description: 'Ring set +0.040',
            free: 1,
            reorderPoint: 2,
            raisedAt: '2026-12-03T08:00:00.000Z',
          },
        ],
      },
      ordersArriving: {
        total: 1,
        items: [
          {
            id: 'o1',
            number: 'PO-2612-0004',
            supplierName: 'Brackenfold Rings',
            state: 'sent_out',
            expectedOn: '2026-12-01',
            late: true,
            outstanding: 6,
          },
        ],
      },
    });
    expect(headings(element)).toEqual(['Waiting for parts', 'Stock alerts', 'Orders on the way']);
    expect(element.querySelector('[aria-labelledby="home-alerts"]')?.textContent).toContain(
      '1 free, reorder point 2',
    );
    const order = element.querySelector('[aria-labelledby="home-ordersArriving"] a.item')!;
    expect(order.getAttribute('href')).toBe('/purchasing/orders/o1');
    expect(order.querySelector('.late')?.textContent).toContain('Expected Tue 01/12/2026, late');
    expect(order.textContent).toContain('6 to come');
  });

  it('when the summary cannot be loaded, then the page says so in words', async () => {
    const element = await render('staff', 'fail');
    expect(element.querySelector('[role="alert"]')?.textContent).toContain(
      'The database is not answering.',
    );
    expect(headings(element)).toEqual([]);
  });
});
