import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';

import type { ImportJson, SupplierJson } from '../../../shared/api/suppliers';
import { setUpHttpTest, signIn } from '../testing/http-test';
import { ImportUpload } from './import-upload';

const SUPPLIER: SupplierJson = {
  id: 's1',
  name: 'Morvendt Motorteile',
  contacts: '',
  email: 'bestellung@morvendt.test',
  currency: 'EUR',
  leadDays: 10,
  minOrder: '150.0000',
  shippingCost: '24.5000',
  notes: '',
  active: true,
  items: 0,
  unmapped: 0,
  lastImportAt: null,
  createdAt: '2026-12-01T08:00:00.000Z',
  updatedAt: '2026-12-01T08:00:00.000Z',
};

const PREVIEW: ImportJson = {
  importId: 'i1',
  status: 'previewed',
  supplierId: 's1',
  supplierName: 'Morvendt Motorteile',
  fileName: 'morvendt.csv',
  fileBytes: 120,
  sha256: 'a'.repeat(64),
  detected: { encoding: 'windows-1252', delimiter: ';', decimal: ',', headerLine: 1 },
  headers: ['Art.-Nr.', 'Bezeichnung', 'Ø mm', 'Preis €'],
  mapping: {
    sku: 'Art.-Nr.',
    description: 'Bezeichnung',
    size: 'Ø mm',
    oversize: null,
    price: 'Preis €',
    available: null,
    leadDays: null,
    gtin: null,
    currency: null,
    sizeUnit: 'mm',
  },
  counts: {
    rows: 3,
    ok: 2,
    errors: 1,
    new: 1,
    up: 1,
    down: 0,
    unchanged: 0,
    missing: 2,
    unmapped: 1,
  },
  errors: [{ line: 4, field: 'price', message: 'The price "-1,00" is negative.' }],
  warnings: [],
  sample: [
    {
      line: 2,
      sku: 'MV-K54-025',
      description: 'Kolben Ø 54,25 mm – Übermaß 0,25',
      size: { mm: '54.250', in: '2.1358' },
      oversize: null,
      price: '48.9000',
      currency: 'EUR',
      available: null,
      leadDays: null,
      gtin: null,
    },
  ],
  priceChanges: { upAveragePercent: '4.0', downAveragePercent: null, largest: [] },
  uploadedBy: { id: 'u1', name: 'Perrin Adeyemi' },
  uploadedAt: '2026-12-01T09:00:00.000Z',
  committedBy: null,
  committedAt: null,
  failure: null,
  duplicateOf: null,
};

describe('ImportUpload', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<ImportUpload>;
  let element: HTMLElement;

  beforeEach(async () => {
    ({ http } = setUpHttpTest());
    await signIn(http, {
      id: 'u1',
      email: 'staff@demo.test',
      name: 'Perrin Adeyemi',
      role: 'staff',
      unit: 'mm',
    });

    fixture = TestBed.createComponent(ImportUpload);
    fixture.componentRef.setInput('supplierId', 's1');
    element = fixture.nativeElement as HTMLElement;
    await fixture.whenStable();
    http
      .expectOne((r) => r.url === '/api/suppliers' && r.method === 'GET')
      .flush({ items: [SUPPLIER], total: 1 });
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  function chooseFile(name = 'morvendt.csv'): void {
    const input = element.querySelector<HTMLInputElement>('input[type=file]');
    const file = new File(['Art.-Nr.;Preis\nA;1,00\n'], name, { type: 'text/csv' });
    Object.defineProperty(input, 'files', { value: [file] });
    input?.dispatchEvent(new Event('change'));
  }

  function button(text: string): HTMLButtonElement {
    const found = Array.from(element.querySelectorAll<HTMLButtonElement>('button')).find((b) =>
      b.textContent?.includes(text),
    );
    if (!found) throw new Error(`No button "${text}"`);
    return found;
  }

  it('when a file is read, then it is sent as multipart to the supplier and the preview shows format, counts and errors by line', async () => {
    chooseFile();
    await fixture.whenStable();
    button('Read the list').click();
    await fixture.whenStable();

    const upload = http.expectOne((r) => r.url === '/api/suppliers/s1/price-lists');
    expect(upload.request.method).toBe('POST');
    expect(upload.request.body).toBeInstanceOf(FormData);
    expect((upload.request.body as FormData).get('file')).toBeInstanceOf(File);
    expect((upload.request.body as FormData).get('mapping')).toBeNull();
    expect(upload.request.params.get('progress')).toMatch(/^[0-9a-f-]{36}$/);
    expect(upload.request.reportProgress).toBe(true);
    upload.flush(PREVIEW);
    await fixture.whenStable();

    const format = element.querySelector('[data-testid=detected-format]')?.textContent ?? '';
    expect(format).toContain('Windows-1252');
    expect(format).toContain('semicolon (;)');
    expect(format).toContain('decimal comma');
    const tiles = Array.from(element.querySelectorAll('[data-testid=import-counts] li')).map(
      (tile) =>
        `${tile.querySelector('.n')?.textContent?.trim()} ${tile.querySelector('.label')?.textContent?.trim()}`,
    );
    expect(tiles).toEqual(
      expect.arrayContaining(['1 new items', '2 missing from this list', '1 rows with errors']),
    );
    const errors = element.querySelector('[data-testid=import-errors]')?.textContent ?? '';
    expect(errors).toContain('The price "-1,00" is negative.');
    // In the list's own unit, as the list wrote it ("54,25 mm").
    expect(element.querySelector('[data-testid=import-sample]')?.textContent).toContain('54.25 mm');
  });

  it('when the preview is applied, then the commit is sent and the result says what changed', async () => {
    chooseFile();
    await fixture.whenStable();
    button('Read the list').click();
    await fixture.whenStable();
    http.expectOne((r) => r.url === '/api/suppliers/s1/price-lists').flush(PREVIEW);
    await fixture.whenStable();

    button('Apply 2 rows').click();
    await fixture.whenStable();
    const commit = http.expectOne((r) => r.url === '/api/price-list-imports/i1/commit');
    expect(commit.request.body).toEqual({ dropMissing: true });
    commit.flush({ status: 'committed', importId: 'i1', counts: PREVIEW.counts });
    await fixture.whenStable();
    expect(element.textContent).toContain('Applied: 1 new items, 1 prices up, 0 down');
  });

  it('when the same file was already applied, then the page says so and shows no preview', async () => {
    chooseFile();
    await fixture.whenStable();
    button('Read the list').click();
    await fixture.whenStable();
    http
      .expectOne((r) => r.url === '/api/suppliers/s1/price-lists')
      .flush({ status: 'duplicate', importId: 'i0', message: 'This file was already imported.' });
    await fixture.whenStable();
    expect(element.textContent).toContain('This file was already imported.');
    expect(element.querySelector('app-import-preview')).toBeNull();
  });

  it('when a column is missing, then the refusal is shown and the columns can be chosen and read again', async () => {
    chooseFile();
    await fixture.whenStable();
    button('Read the list').click();
    await fixture.whenStable();
    http
      .expectOne((r) => r.url === '/api/suppliers/s1/price-lists')
      .flush(
        {
          error: {
            code: 'missing_column',
            message: 'Missing required column: price.',
            details: [{ field: 'price', message: 'No column holds the price.' }],
            headers: ['Code', 'Amount'],
            mapping: {
              ...PREVIEW.mapping,
              sku: 'Code',
              price: null,
              description: null,
              size: null,
            },
          },
        },
        { status: 400, statusText: 'Bad Request' },
      );
    await fixture.whenStable();
    expect(element.querySelector('[role=alert]')?.textContent).toContain(
      'Missing required column: price.',
    );
    expect(button('Read again with these columns').disabled).toBe(true);
  });
});
