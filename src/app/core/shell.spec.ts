import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatNavListHarness } from '@angular/material/list/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { provideRouter, Router } from '@angular/router';

import type { Role, SessionResponse } from '../../../shared/session-types';
import { navItemsFor } from './nav-items';
import { Session } from './session';
import { Shell } from './shell';

function sessionFor(role: Role): SessionResponse {
  return {
    user: { id: 'u1', email: 'jory@example.test', name: 'Jory Tanhill', role, unit: 'mm' },
    shop: { name: 'Bluegill Bore & Hone' },
  };
}

describe('Shell', () => {
  let http: HttpTestingController;

  async function render(role: Role) {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    const loading = TestBed.inject(Session).load();
    http.expectOne('/api/session').flush(sessionFor(role));
    await loading;
    const fixture = TestBed.createComponent(Shell);
    await fixture.whenStable();
    return { fixture, loader: TestbedHarnessEnvironment.loader(fixture) };
  }

  async function navLabels(role: Role): Promise<string[]> {
    const { loader } = await render(role);
    const nav = await loader.getHarness(MatNavListHarness);
    const items = await nav.getItems();
    return Promise.all(items.map((item) => item.getTitle()));
  }

  afterEach(() => http.verify());

  it('when an owner is signed in, then the navigation lists Home, Users and My account', async () => {
    const labels = await navLabels('owner');
    expect(labels).toEqual(navItemsFor('owner').map((item) => item.label));
    expect(labels).toEqual(expect.arrayContaining(['Home', 'Users', 'My account']));
  });

  it.each<Role>(['buyer', 'machinist', 'staff'])(
    'when a %s is signed in, then the navigation has no Users entry',
    async (role) => {
      const labels = await navLabels(role);
      expect(labels).toEqual(navItemsFor(role).map((item) => item.label));
      expect(labels).toEqual(expect.arrayContaining(['Home', 'My account']));
      expect(labels).not.toContain('Users');
    },
  );

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
