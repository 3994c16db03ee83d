import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';

import type { EstimateJson, PublicJobJson } from '../../../shared/api/money';
import { setUpHttpTest } from '../testing/http-test';
import { estimateJson } from '../testing/money-fixtures';
import { PublicJobPage } from './public-job-page';

const TOKEN = 'q7VdL2mXk9PzR4tYb8NcW1sJh6GfA3eU0oKiMnBvC5x';

// Invented: 2 × 55.00 = 110.00, subtotal 110.00, tax at 20 % on it 22.00, total 132.00; the deposit
// asked for is 30 % of 132.00 = 39.60 (all worked by hand).
function page(estimate: Partial<EstimateJson> = {}, extra: Partial<PublicJobJson> = {}) {
  const body: PublicJobJson = {
    shop: { name: 'Hollin Brook Bore Works', hours: 'Mon–Fri 8:00–17:00' },
    job: {
      number: 'J-260042',
      state: 'gauged',
      stateText: 'Measured. The bores are measured; the pistons are being chosen to fit them.',
      cylinders: 2,
    },
    estimate: estimateJson({ state: 'sent', sentAt: '2026-12-03T09:00:00.000Z', ...estimate }),
    payments: [],
    ...extra,
  };
  return body;
}

describe('PublicJobPage', () => {
  let http: HttpTestingController;

  async function render(answer: PublicJobJson | 404) {
    ({ http } = setUpHttpTest());
    const fixture = TestBed.createComponent(PublicJobPage);
    fixture.componentRef.setInput('token', TOKEN);
    fixture.detectChanges();
    const request = http.expectOne(`/api/public/jobs/${TOKEN}`);
    if (answer === 404)
      request.flush(
        { error: { code: 'not_found', message: 'That link was not found.' } },
        { status: 404, statusText: 'Not Found' },
      );
    else request.flush(answer);
    await fixture.whenStable();
    fixture.detectChanges();
    return { fixture, element: fixture.nativeElement as HTMLElement };
  }

  function button(element: HTMLElement, text: string): HTMLButtonElement | undefined {
    return Array.from(element.querySelectorAll('button')).find((b) =>
      b.textContent?.trim().endsWith(text),
    );
  }

  afterEach(() => http.verify());

  it('when the customer opens a sent estimate, then the shop, the job, its state and the lines show, with Approve and Decline', async () => {
    const { element } = await render(page());
    expect(element.querySelector('h1')?.textContent?.trim()).toBe('Job J-260042');
    expect(element.textContent).toContain('Hollin Brook Bore Works');
    expect(element.querySelector('[data-figure="job-state"]')?.textContent).toContain(
      'The bores are measured',
    );
    expect(element.querySelector('[data-figure="total"]')?.textContent?.trim()).toBe('€132.00');
    expect(element.querySelector('main')).not.toBeNull();
    expect(button(element, 'Approve')).toBeDefined();
    expect(button(element, 'Decline')).toBeDefined();
    // Read only for the customer: no line can be changed here.
    expect(element.querySelector('button[aria-label^="Remove"]')).toBeNull();
  });

  it('when the customer approves, then the answer goes by the token and the page thanks them and shows it agreed', async () => {
    const { fixture, element } = await render(page());
    button(element, 'Approve')!.click();
    const post = http.expectOne(`/api/public/jobs/${TOKEN}/approve`);
    expect(post.request.method).toBe('POST');
    post.flush({ state: 'approved' });
    http
      .expectOne(`/api/public/jobs/${TOKEN}`)
      .flush(page({ state: 'approved', decidedAt: '2026-12-03T10:00:00.000Z' }));
    await fixture.whenStable();
    fixture.detectChanges();
    expect(element.textContent).toContain('the shop has your agreement');
    expect(element.textContent).toContain('You agreed to this estimate.');
    expect(button(element, 'Approve')).toBeUndefined();
  });

  it('when a deposit is asked for, then a link says what it pays and opens the payment page; a paid one says so', async () => {
    const url = 'http://127.0.0.1:4290/pay/cs_test_a1';
    const { element } = await render(
      page(
        { state: 'approved' },
        {
          payments: [
            { purpose: 'balance', amount: '92.40', state: 'paid', url: null },
            { purpose: 'deposit', amount: '39.60', state: 'open', url },
          ],
        },
      ),
    );
    const link = element.querySelector<HTMLAnchorElement>('.payments a');
    expect(link?.textContent?.trim()).toMatch(/(^| )Pay deposit of €39\.60$/);
    expect(link?.getAttribute('href')).toBe(url);
    expect(element.querySelector('.payments')?.textContent).toContain('Balance of €92.40 paid.');
  });

  it('when the link is wrong or expired, then one plain page says so and nothing about any job', async () => {
    const { element } = await render(404);
    expect(element.querySelector('h1')?.textContent?.trim()).toBe(
      'This link is not valid or has expired',
    );
    expect(element.textContent).not.toMatch(/J-26|estimate|€/i);
  });
});
