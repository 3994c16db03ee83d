import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatNavListHarness } from '@angular/material/list/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { provideRouter, Router } from '@angular/router';

import type { Role, SessionResponse } from '../../../shared/session-types';
import { NAV_GROUPS, navGroupsFor, navItemsFor } from './nav-items';
import { Session } from './session';
import { Shell } from './shell';

@Component({ template: '' })
class Blank {}

// Every path the navigation links to, so the spec can open each page and read the highlight.
const ROUTES = [{ path: '**', component: Blank }];

function sessionFor(role: Role): SessionResponse {
  return {
    user: { id: 'u1', email: 'jory@example.test', name: 'Jory Tanhill', role, unit: 'mm' },
    shop: { name: 'Bluegill Bore & Hone' },
  };
}

describe('Shell', () => {
  let http: HttpTestingController;

  /** `folded`: the headings this device remembers as folded. */
  async function render(role: Role, folded: string[] = []) {
    localStorage.clear();
    if (folded.length) localStorage.setItem('stepstock.nav.collapsed', JSON.stringify(folded));
    TestBed.configureTestingModule({
      providers: [provideRouter(ROUTES), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    const loading = TestBed.inject(Session).load();
    http.expectOne('/api/session').flush(sessionFor(role));
    await loading;
    const fixture = TestBed.createComponent(Shell);
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture) };
  }

  async function navLabelsNow(fixture: { nativeElement: unknown }): Promise<string[]> {
    const element = fixture.nativeElement as HTMLElement;
    return Array.from(element.querySelectorAll('nav a [matListItemTitle]')).map(
      (title) => title.textContent?.trim() ?? '',
    );
  }

  async function navLabels(role: Role): Promise<string[]> {
    const { loader } = await render(role);
    const lists = await loader.getAllHarnesses(MatNavListHarness);
    const items = (await Promise.all(lists.map((list) => list.getItems()))).flat();
    return Promise.all(items.map((item) => item.getTitle()));
  }

  afterEach(() => http.verify());

  it('when an owner is signed in, then the navigation lists Home, Users and My account', async () => {
    const labels = await navLabels('owner');
    expect(labels).toEqual(
      navGroupsFor('owner').flatMap((group) => group.items.map((item) => item.label)),
    );
    expect([...labels].sort()).toEqual(
      navItemsFor('owner')
        .map((item) => item.label)
        .sort(),
    );
    expect(labels).toEqual(expect.arrayContaining(['Home', 'Users', 'My account']));
  });

  it.each<Role>(['buyer', 'machinist', 'staff'])(
    'when a %s is signed in, then the navigation has no Users entry',
    async (role) => {
      const labels = await navLabels(role);
      expect([...labels].sort()).toEqual(
        navItemsFor(role)
          .map((item) => item.label)
          .sort(),
      );
      expect(labels).toEqual(expect.arrayContaining(['Home', 'My account']));
      expect(labels).not.toContain('Users');
    },
  );

  it('when an owner is signed in, then the entries sit under a few named, foldable headings', async () => {
    const { fixture } = await render('owner');
    const element = fixture.nativeElement as HTMLElement;
    const headings = Array.from(element.querySelectorAll('nav .nav-group-toggle')).map((button) =>
      button.textContent?.replace(/expand_(less|more)/, '').trim(),
    );
    expect(headings).toEqual(NAV_GROUPS.map((group) => group.label));
    expect(headings.length).toBeLessThanOrEqual(6);
    for (const group of navGroupsFor('owner')) expect(group.items.length).toBeLessThanOrEqual(10);
  });

  it('when a heading is folded, then its entries hide, and it stays folded after a reload', async () => {
    const { fixture } = await render('buyer');
    const element = fixture.nativeElement as HTMLElement;
    const figures = Array.from(
      element.querySelectorAll<HTMLButtonElement>('.nav-group-toggle'),
    ).find((button) => button.textContent?.includes('Figures'));
    expect(figures?.getAttribute('aria-expanded')).toBe('true');
    figures?.click();
    await fixture.whenStable();
    expect(figures?.getAttribute('aria-expanded')).toBe('false');
    expect(await navLabelsNow(fixture)).not.toContain('What sits');
    expect(JSON.parse(localStorage.getItem('stepstock.nav.collapsed') ?? '[]')).toEqual([
      'figures',
    ]);

    const again = TestBed.createComponent(Shell);
    await again.whenStable();
    expect(await navLabelsNow(again)).not.toContain('What sits');
    expect(await navLabelsNow(again)).toContain('Reorder');
  });

  it.each([
    ['/jobs/new', 'Take in a job'],
    ['/jobs', 'Job bench'],
    ['/jobs/4f1c2a', 'Job bench'],
    ['/imports/new', 'Bring in a price list'],
    ['/imports', 'Price-list log'],
    ['/imports/7b21', 'Price-list log'],
    ['/', 'Home'],
  ])('when %s is open, then exactly one entry is highlighted: %s', async (url, label) => {
    const { fixture } = await render('owner');
    await TestBed.inject(Router).navigateByUrl(url);
    await fixture.whenStable();
    const element = fixture.nativeElement as HTMLElement;
    const current = Array.from(element.querySelectorAll('nav a[aria-current="page"]')).map((link) =>
      link.querySelector('[matListItemTitle]')?.textContent?.trim(),
    );
    expect(current).toEqual([label]);
    expect(element.querySelectorAll('nav .mdc-list-item--activated').length).toBe(1);
  });

  it('when a page of a folded heading is open, then that heading shows anyway', async () => {
    const { fixture } = await render('owner', ['figures']);
    await TestBed.inject(Router).navigateByUrl('/insights/stock');
    await fixture.whenStable();
    expect(await navLabelsNow(fixture)).toContain('What sits');
  });

  it('when signed in, then the top bar shows the shop name and the user menu their name and role', async () => {
    const { fixture, loader } = await render('buyer');
    const element = fixture.nativeElement as HTMLElement;
    expect(element.querySelector('.brand-name')?.textContent?.trim()).toBe('Bluegill Bore & Hone');
    expect(element.querySelector('.user-button')?.textContent).toContain('Jory Tanhill');
    expect(element.querySelector('.user-button')?.textContent).toContain('Buyer');

    const menu = await loader.getHarness(MatMenuHarness);
    await menu.open();
    // Item text includes the icon's ligature name (hidden from screen readers), hence the suffixes.
    const labels = await Promise.all((await menu.getItems()).map((item) => item.getText()));
    expect(labels).toEqual([
      expect.stringMatching(/My account$/),
      expect.stringMatching(/Sign out$/),
    ]);
  });

  it('when "Sign out" is chosen, then the session is deleted and the sign-in page opens', async () => {
    const { loader } = await render('staff');
    const router = TestBed.inject(Router);
    const navigate = jest.spyOn(router, 'navigateByUrl').mockResolvedValue(true);

    const menu = await loader.getHarness(MatMenuHarness);
    await menu.clickItem({ text: /Sign out$/ });
    const request = http.expectOne('/api/session');
    expect(request.request.method).toBe('DELETE');
    request.flush(null, { status: 204, statusText: 'No Content' });

    expect(TestBed.inject(Session).user()).toBeNull();
    expect(navigate).toHaveBeenCalledWith('/sign-in');
  });

  it('when the session had already ended (401 on sign out), then it still counts as signed out', async () => {
    const { loader } = await render('owner');
    const navigate = jest.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
    const menu = await loader.getHarness(MatMenuHarness);
    await menu.clickItem({ text: /Sign out$/ });
    http.expectOne('/api/session').flush(null, { status: 401, statusText: 'Unauthorized' });
    expect(TestBed.inject(Session).user()).toBeNull();
    expect(navigate).toHaveBeenCalledWith('/sign-in');
  });
});
