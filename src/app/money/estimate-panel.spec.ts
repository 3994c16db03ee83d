import { HttpTestingController } from '@angular/common/http/testing';
import { Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';

import type { EstimateJson } from '../../../shared/api/money';
import type { Role } from '../../../shared/session-types';
import { setUpHttpTest, signIn } from '../testing/http-test';
import { BORE_LINE, estimateJson } from '../testing/money-fixtures';
import { EstimatePanel } from './estimate-panel';
import type { MoneyJob } from './money-words';

const JOB: MoneyJob = {
  id: 'job-1',
  number: 'J-260042',
  state: 'gauged',
  updatedAt: '2026-12-03T09:00:00.000Z',
};

// Invented figures worked by hand: 2 × 55.00 = 110.00 and 1 × 12.00 = 12.00; subtotal 122.00; tax
// at 20 % on the subtotal 24.40; total 146.40.
function estimate(extra: Partial<EstimateJson> = {}): EstimateJson {
  return estimateJson({
    lines: [
      BORE_LINE,
      {
        id: 'l2',
        kind: 'other',
        description: 'Clean and inspect',
        quantity: '1',
        unitPrice: '12.00',
        total: '12.00',
        fromJob: false,
      },
    ],
    subtotal: '122.00',
    tax: '24.40',
    total: '146.40',
    ...extra,
  });
}

@Component({
  selector: 'app-host',
  imports: [EstimatePanel],
  template: '<app-estimate-panel [job]="job()" />',
})
class Host {
  readonly job = signal(JOB);
}

describe('EstimatePanel', () => {
  let http: HttpTestingController;

  async function render(role: Role, body: EstimateJson, job: MoneyJob = JOB) {
    ({ http } = setUpHttpTest());
    await signIn(
      http,
      { id: 'u1', email: 'p@example.test', name: 'Tamsin Reedbank', role, unit: 'mm' },
      { name: 'Hollin Brook Bore Works', locale: 'en-GB', timeZone: 'UTC', currency: 'EUR' },
    );
    const fixture = TestBed.createComponent(Host);
    fixture.componentInstance.job.set(job);
    fixture.detectChanges();
    http.expectOne(`/api/jobs/${job.id}/estimate`).flush(body);
    await fixture.whenStable();
    fixture.detectChanges();
    return { fixture, element: fixture.nativeElement as HTMLElement };
  }

  function button(element: HTMLElement, text: string): HTMLButtonElement | undefined {
    return Array.from(element.querySelectorAll('button')).find((b) =>
      b.textContent?.trim().includes(text),
    );
  }

  afterEach(() => http.verify());

  it('when staff open a draft, then its lines, totals, state and rule show in words', async () => {
    const { element } = await render('staff', estimate());
    const rows = Array.from(element.querySelectorAll('tbody tr')).map((r) =>
      Array.from(r.querySelectorAll('td'))
        .slice(0, 4)
        .map((c) => c.textContent?.replace(/\s+/g, ' ').trim()),
    );
    expect(rows).toEqual([
      ['Bore one cylinder Labour', '2', '€55.00', '€110.00'],
      ['Clean and inspect Other', '1', '€12.00', '€12.00'],
    ]);
    expect(element.querySelector('[data-figure="total"]')?.textContent?.trim()).toBe('€146.40');
    expect(element.querySelector('.badge')?.textContent?.trim()).toBe('Being priced');
    expect(element.textContent).toContain('rounded half-up to the cent');
    expect(element.textContent).toContain('on the subtotal');
    expect(button(element, 'Send to the customer')).toBeDefined();
  });

  it('when staff add a line, then the exact typed text is sent and the estimate is read again', async () => {
    const { fixture, element } = await render('staff', estimate());
    const inputs = element.querySelectorAll<HTMLInputElement>('form.panel-form input');
    const values = ['Deglaze the bores', '1.5', '8.35'];
    inputs.forEach((input, i) => {
      input.value = values[i];
      input.dispatchEvent(new Event('input'));
    });
    button(element, 'Add the line')!.click();
    const post = http.expectOne('/api/jobs/job-1/estimate/lines');
    expect(post.request.method).toBe('POST');
    expect(post.request.body).toEqual({
      description: 'Deglaze the bores',
      quantity: '1.5',
      unitPrice: '8.35',
    });
    post.flush({}, { status: 201, statusText: 'Created' });
    TestBed.tick();
    http.expectOne('/api/jobs/job-1/estimate').flush(estimate());
    await fixture.whenStable();
  });

  it('when sending is refused for want of an e-mail, then the server’s reason shows as an alert', async () => {
    const { fixture, element } = await render('staff', estimate());
    button(element, 'Send to the customer')!.click();
    http.expectOne('/api/jobs/job-1/estimate/send').flush(
      {
        error: {
          code: 'no_email',
          message:
            'Job J-260042 has no customer e-mail address: add one to the job, or take the approval by phone or at the counter.',
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    await fixture.whenStable();
    fixture.detectChanges();
    const alert = element.querySelector('[data-alert="estimate"]');
    expect(alert?.getAttribute('role')).toBe('alert');
    expect(alert?.textContent).toContain('has no customer e-mail address');
  });

  it('when a machinist opens it, then it is read only: no line buttons, no forms, no sending', async () => {
    const { element } = await render('machinist', estimate());
    expect(element.querySelectorAll('tbody tr')).toHaveLength(2);
    expect(element.querySelector('form')).toBeNull();
    expect(element.querySelector('button[aria-label^="Remove"]')).toBeNull();
    expect(button(element, 'Send to the customer')).toBeUndefined();
    expect(button(element, 'Record approval')).toBeUndefined();
  });

  it('when it changed after the customer agreed, then the page says so and by how much', async () => {
    // Agreed at 136.40; now 146.40: 146.40 − 136.40 = 10.00 more (worked by hand).
    const { element } = await render(
      'owner',
      estimate({
        version: 3,
        sentAt: '2026-12-01T10:00:00.000Z',
        approvedVersion: { version: 2, total: '136.40', approvedAt: '2026-12-01T15:30:00.000Z' },
      }),
    );
    const note = element.querySelector('[role="note"]')?.textContent ?? '';
    expect(note).toContain('Changed since it was sent on 01/12/2026 10:00');
    expect(note).toContain('They agreed to version 2 (€136.40)');
    expect(note).toContain('this version is €10.00 more');
  });

  it('when staff record an approval taken by phone, then how and the note go to the server', async () => {
    const { fixture, element } = await render('staff', estimate({ state: 'sent' }));
    button(element, 'Record approval at the counter')!.click();
    fixture.detectChanges();
    button(element, 'By phone')!.click();
    const note = element.querySelector<HTMLInputElement>('form.panel-form:last-of-type input')!;
    note.value = 'agreed at 10:20';
    note.dispatchEvent(new Event('input'));
    button(element, 'Record the agreement')!.click();
    const post = http.expectOne('/api/jobs/job-1/estimate/approval');
    expect(post.request.body).toEqual({ how: 'phone', note: 'agreed at 10:20' });
    post.flush({ state: 'approved' });
    TestBed.tick();
    http.expectOne('/api/jobs/job-1/estimate').flush(estimate({ state: 'approved' }));
    await fixture.whenStable();
  });
});
