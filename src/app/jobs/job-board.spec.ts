import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';

import { setUpHttpTest, signIn } from '../testing/http-test';
import { jobListItem } from '../testing/job-fixtures';
import { JobBoard } from './job-board';

describe('JobBoard', () => {
  let http: HttpTestingController;

  afterEach(() => http.verify());

  it('when open jobs load, then each sits in its stage column in the order given, waiting jobs marked', async () => {
    ({ http } = setUpHttpTest());
    await signIn(http, {
      id: 'u1',
      email: 'perrin@example.test',
      name: 'Perrin',
      role: 'staff',
      unit: 'in',
    });
    const fixture = TestBed.createComponent(JobBoard);
    await fixture.whenStable();
    const request = http.expectOne((r) => r.url === '/api/jobs');
    expect(request.request.params.get('state')).toBe('open');
    expect(request.request.params.get('sort')).toBe('due');
    request.flush({
      items: [
        jobListItem('CY-2612-0007', 'gauged', {
          dueDate: '2026-11-28',
          overdue: true,
          waitingForParts: true,
          waitingFor: ['rings'],
        }),
        jobListItem('CY-2612-0003', 'booked_in', { dueDate: '2026-12-02' }),
        jobListItem('CY-2612-0001', 'booked_in'),
      ],
      total: 3,
    });
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    const columns = Array.from(element.querySelectorAll('.column'));
    expect(
      columns.map((c) => c.querySelector('h2')?.textContent?.replace(/\s+/g, ' ').trim()),
    ).toEqual([
      'Booked in 2',
      'Gauged 1',
      'Parts set aside 0',
      'On the bar 0',
      'At the hone 0',
      'Ready to go 0',
    ]);
    const booked = Array.from(columns[0].querySelectorAll('.number')).map((n) =>
      n.textContent?.trim(),
    );
    expect(booked).toEqual(['CY-2612-0003', 'CY-2612-0001']);
    // The badge names the part that is missing, as the server's one rule found it.
    expect(columns[1].querySelector('.waiting-badge')?.textContent).toContain(
      'Waiting for a ring set',
    );
    expect(columns[1].querySelector('.due.overdue')?.textContent).toContain('Overdue');
    expect(element.querySelector('.summary')?.textContent).toContain(
      '3 open jobs, 1 waiting for parts.',
    );
  });

  it('when the bench opens, then every stage sits in one sideways strip, with a button and count per stage that brings its column into view', async () => {
    ({ http } = setUpHttpTest());
    await signIn(http, {
      id: 'u2',
      email: 'ansel@example.test',
      name: 'Ansel',
      role: 'machinist',
      unit: 'mm',
    });
    const fixture = TestBed.createComponent(JobBoard);
    await fixture.whenStable();
    http
      .expectOne((r) => r.url === '/api/jobs')
      .flush({
        items: [
          jobListItem('CY-2612-0010', 'at_the_hone'),
          jobListItem('CY-2612-0011', 'booked_in'),
        ],
        total: 2,
      });
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;

    const strip = element.querySelector<HTMLElement>('.columns')!;
    expect(strip.getAttribute('role')).toBe('region');
    expect(strip.getAttribute('tabindex')).toBe('0');
    expect(strip.querySelectorAll(':scope > .column')).toHaveLength(6);

    const chips = Array.from(
      element.querySelectorAll<HTMLButtonElement>('nav[aria-label="Go to a stage"] button'),
    );
    expect(chips.map((c) => c.textContent?.replace(/\s+/g, ' ').trim())).toEqual([
      'Booked in 1',
      'Gauged 0',
      'Parts set aside 0',
      'On the bar 0',
      'At the hone 1',
      'Ready to go 0',
    ]);

    const hone = element.querySelector<HTMLElement>('#column-at_the_hone')!;
    Object.defineProperty(hone, 'offsetLeft', { value: 744 });
    const scrollTo = jest.fn();
    strip.scrollTo = scrollTo as unknown as typeof strip.scrollTo;
    chips[4].click();
    expect(chips[4].getAttribute('aria-controls')).toBe('column-at_the_hone');
    expect(scrollTo).toHaveBeenCalledWith({ left: 744, behavior: 'smooth' });
    expect(document.activeElement?.textContent).toContain('CY-2612-0010');
  });
});
