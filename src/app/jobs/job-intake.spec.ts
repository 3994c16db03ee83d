import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';

import { provideShopDateAdapter } from '../core/shop-date-adapter';
import { setUpHttpTest, signIn } from '../testing/http-test';
import { JobIntake } from './job-intake';

describe('JobIntake', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<JobIntake>;

  beforeEach(async () => {
    ({ http } = setUpHttpTest({ providers: [provideShopDateAdapter()] }));
    await signIn(
      http,
      { id: 'u1', email: 'perrin@example.test', name: 'Perrin', role: 'staff', unit: 'in' },
      { name: 'Invented Bore Works', timeZone: 'UTC', locale: 'en-US' },
    );
    fixture = TestBed.createComponent(JobIntake);
    await fixture.whenStable();
    http.expectOne((r) => r.url === '/api/engine-families').flush({ items: [], total: 0 });
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  async function typeDue(text: string): Promise<HTMLElement> {
    const element = fixture.nativeElement as HTMLElement;
    const input = element.querySelector<HTMLInputElement>('input.mat-datepicker-input');
    if (!input) throw new Error('no due-date field');
    input.value = text;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    return element.querySelector('.due') as HTMLElement;
  }

  it('when the shop writes dates month first, then the due-date field says so', async () => {
    const due = await typeDue('');
    expect(due.textContent).toContain('MM/DD/YYYY');
  });

  it('when a due date of 01/01/2099 is typed, then a caution asks to check the year (the date is not refused)', async () => {
    const due = await typeDue('01/01/2099');
    expect(due.querySelector('.due-warning')?.textContent?.trim()).toBe(
      'That is more than a year ahead: check the year.',
    );
    expect(due.querySelector('mat-error')).toBeNull();
  });

  it('when a due date already past is typed, then a caution says so', async () => {
    const due = await typeDue('01/02/2020');
    expect(due.querySelector('.due-warning')?.textContent).toContain('already passed');
  });

  it('when a due date next week is typed, then there is no caution', async () => {
    const next = new Date(Date.now() + 7 * 86_400_000);
    const us = `${String(next.getUTCMonth() + 1).padStart(2, '0')}/${String(next.getUTCDate()).padStart(2, '0')}/${next.getUTCFullYear()}`;
    const due = await typeDue(us);
    expect(due.querySelector('.due-warning')).toBeNull();
  });
});
