import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

import type { UnmappedItemJson } from '../../../shared/api/suppliers';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { MappingQueue } from './mapping-queue';

const ITEM: UnmappedItemJson = {
  id: 'it1',
  supplierId: 's1',
  supplierName: 'Tessaway Engine Spares',
  sku: 'TW-6640-050',
  description: 'Piston 66.90 mm (+0.50), forged',
  size: { mm: '66.900', in: '2.6339' },
  oversize: { mm: '0.500', in: '0.0197' },
  part: null,
  price: '58.1000',
  currency: 'GBP',
  available: 3,
  leadDays: 14,
  gtin: null,
  lastImportId: 'i1',
  lastSeenAt: '2026-12-01T09:00:00.000Z',
  dropped: false,
  updatedAt: '2026-12-01T09:00:00.000Z',
  suggestions: [
    {
      id: 'p1',
      sku: 'OR-250L-PF-050',
      description: 'Piston forged +0.50',
      kind: 'piston',
      familyCode: 'OR-250L',
      stepLabel: '+0.50 mm',
      reasons: ['same size', 'a piston, as the description says'],
      score: 5.4,
    },
  ],
};

async function setUp(role: 'buyer' | 'staff') {
  const notifier = { success: jest.fn(), error: jest.fn() };
  TestBed.configureTestingModule({
    providers: [
      provideHttpClient(),
      provideHttpClientTesting(),
      provideRouter([]),
      { provide: Notifier, useValue: notifier },
    ],
  });
  const http = TestBed.inject(HttpTestingController);
  const loading = TestBed.inject(Session).load();
  http.expectOne('/api/session').flush({
    user: { id: 'u1', email: `${role}@demo.test`, name: 'Test', role, unit: 'mm' },
  });
  await loading;
  const fixture: ComponentFixture<MappingQueue> = TestBed.createComponent(MappingQueue);
  await fixture.whenStable();
  http
    .expectOne((r) => r.url === '/api/supplier-items/unmapped')
    .flush({ items: [ITEM], total: 1 });
  await fixture.whenStable();
  return { http, fixture, notifier, element: fixture.nativeElement as HTMLElement };
}

describe('MappingQueue', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('when a buyer picks the suggested part, then the item is mapped and the queue reloads', async () => {
    const { http, fixture, notifier, element } = await setUp('buyer');
    const suggestion = element.querySelector<HTMLButtonElement>('button.suggestion');
    expect(suggestion?.textContent).toContain('OR-250L-PF-050');
    expect(suggestion?.textContent).toContain('same size');
    suggestion?.click();
    await fixture.whenStable();
    const patch = http.expectOne('/api/supplier-items/it1');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toEqual({ partId: 'p1' });
    patch.flush({ ...ITEM, part: { id: 'p1', sku: 'OR-250L-PF-050' } });
    await fixture.whenStable();
    expect(notifier.success).toHaveBeenCalledWith(
      'TW-6640-050 of Tessaway Engine Spares is now OR-250L-PF-050.',
    );
    http.expectOne((r) => r.url === '/api/supplier-items/unmapped').flush({ items: [], total: 0 });
    await fixture.whenStable();
    expect(element.textContent).toContain('Nothing to map');
  });

  it('when staff read the queue, then the suggestions show but cannot be picked', async () => {
    const { element } = await setUp('staff');
    expect(element.querySelector<HTMLButtonElement>('button.suggestion')?.disabled).toBe(true);
    expect(element.textContent).toContain('A buyer links them.');
  });
});
