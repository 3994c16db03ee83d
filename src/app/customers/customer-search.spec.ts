import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatAutocompleteHarness } from '@angular/material/autocomplete/testing';

import type { CustomerListItemJson } from '../../../shared/api/customers';
import { CustomerSearch } from './customer-search';

const FOUND: CustomerListItemJson[] = [
  { id: 'c1', name: 'Ingram Vessey', phone: '555 0107', email: null, acceptsEmail: true },
  { id: 'c2', name: 'Inés Halloway', phone: null, email: 'ines@example.test', acceptsEmail: false },
];

describe('CustomerSearch', () => {
  let http: HttpTestingController;

  async function render(excludeId: string | null = null) {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(CustomerSearch);
    fixture.componentRef.setInput('excludeId', excludeId);
    const picked: CustomerListItemJson[] = [];
    fixture.componentInstance.picked.subscribe((c) => picked.push(c));
    await fixture.whenStable();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    return { fixture, picked, auto: await loader.getHarness(MatAutocompleteHarness) };
  }

  /** The search waits 150 ms after the last key before it asks the server. */
  async function afterDebounce() {
    await new Promise((r) => setTimeout(r, 200));
  }

  afterEach(() => http.verify());

  it('when one letter is typed, then nothing is asked; when two are, then the server is searched and the customers offered', async () => {
    const { auto, picked, fixture } = await render();
    await auto.enterText('I');
    await afterDebounce();
    http.expectNone((r) => r.url === '/api/customers');
    await auto.enterText('n');
    await afterDebounce();
    const request = http.expectOne((r) => r.url === '/api/customers');
    expect(request.request.params.get('q')).toBe('In');
    request.flush({ items: FOUND, total: 2 });
    await fixture.whenStable();
    await auto.blur();
    await auto.focus();
    const options = await auto.getOptions();
    expect(await Promise.all(options.map((o) => o.getText()))).toEqual([
      'Ingram Vessey · 555 0107',
      'Inés Halloway · ines@example.test',
    ]);
    await options[0].click();
    expect(picked.map((c) => c.id)).toEqual(['c1']);
    // The field empties once a customer is picked: the pick shows beside it.
    expect(await auto.getValue()).toBe('');
  });

  it('when the customer being merged into is among the answers, then it is left out', async () => {
    const { auto, fixture } = await render('c1');
    await auto.enterText('In');
    await afterDebounce();
    http.expectOne((r) => r.url === '/api/customers').flush({ items: FOUND, total: 2 });
    await fixture.whenStable();
    await auto.blur();
    await auto.focus();
    const options = await auto.getOptions();
    expect(await Promise.all(options.map((o) => o.getText()))).toEqual([
      'Inés Halloway · ines@example.test',
    ]);
  });
});
