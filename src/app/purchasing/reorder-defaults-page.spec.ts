import { HttpTestingController } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatInputHarness } from '@angular/material/input/testing';

import { setUpHttpTest, type NotifierMock } from '../testing/http-test';
import { ReorderDefaultsPage } from './reorder-defaults-page';

const FAMILY = { id: 'f1', code: 'QX-90', name: 'Invented twin' };
const DEFAULT = {
  id: 'd1',
  familyId: 'f1',
  familyCode: 'QX-90',
  stepId: null,
  stepLabel: null,
  kind: 'piston',
  reorderPoint: 2,
  orderUpTo: 5,
};

describe('ReorderDefaultsPage', () => {
  let http: HttpTestingController;
  let fixture: ComponentFixture<ReorderDefaultsPage>;
  let loader: HarnessLoader;
  let notifier: NotifierMock;

  beforeEach(async () => {
    ({ http, notifier } = setUpHttpTest());
    fixture = TestBed.createComponent(ReorderDefaultsPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    http.expectOne((r) => r.url === '/api/engine-families').flush({ items: [FAMILY], total: 1 });
    http.expectOne('/api/engine-families/f1/ladder').flush({ family: FAMILY, steps: [] });
    http.expectOne((r) => r.url === '/api/reorder-defaults').flush({ items: [DEFAULT], total: 1 });
    await fixture.whenStable();
  });

  afterEach(() => http.verify());

  it("when a family is open, then its defaults are listed with 'Every step' for a family-wide one", () => {
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain('Every step');
  });

  it('when a family-wide default is saved, then it is sent with no step and the list reloads', async () => {
    const point = await loader.getHarness(
      MatInputHarness.with({ selector: '[formControlName=reorderPoint]' }),
    );
    await point.setValue('3');
    const upTo = await loader.getHarness(
      MatInputHarness.with({ selector: '[formControlName=orderUpTo]' }),
    );
    await upTo.setValue('8');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save the default' }))).click();
    const req = http.expectOne('/api/reorder-defaults');
    expect(req.request.method).toBe('PUT');
    expect(req.request.body).toEqual({
      familyId: 'f1',
      stepId: null,
      kind: 'piston',
      reorderPoint: 3,
      orderUpTo: 8,
    });
    req.flush({ ...DEFAULT, reorderPoint: 3, orderUpTo: 8 });
    http.expectOne((r) => r.url === '/api/reorder-defaults').flush({ items: [], total: 0 });
    await fixture.whenStable();
    expect(notifier.success).toHaveBeenCalled();
  });
});
