import { TestBed } from '@angular/core/testing';

import { setUpHttpTest } from '../testing/http-test';
import { CreditNoteForm } from './credit-note-form';

describe('CreditNoteForm', () => {
  function render() {
    const { http, notifier } = setUpHttpTest();
    const fixture = TestBed.createComponent(CreditNoteForm);
    fixture.componentRef.setInput('jobId', 'job-1');
    fixture.componentRef.setInput('invoiceNumber', 'INV-000007');
    fixture.componentRef.setInput('currency', 'EUR');
    const issued = jest.fn();
    fixture.componentInstance.issued.subscribe(issued);
    fixture.detectChanges();
    const el = fixture.nativeElement as HTMLElement;
    return { http, notifier, fixture, el, issued };
  }

  function type(el: HTMLElement, name: string, value: string) {
    const input = el.querySelector<HTMLInputElement>(`input[formcontrolname="${name}"]`);
    if (!input) throw new Error(`no ${name} field`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
  }

  it('when staff give a reason and an amount, then a credit note is asked for and the invoice is read again', async () => {
    const { http, notifier, fixture, el, issued } = render();
    el.querySelector<HTMLButtonElement>('button')?.click();
    fixture.detectChanges();
    type(el, 'reason', 'One ring set not fitted');
    type(el, 'amount', '20.00');
    el.querySelector<HTMLFormElement>('form')?.dispatchEvent(new Event('submit'));
    const req = http.expectOne('/api/jobs/job-1/invoice/credit-notes');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ reason: 'One ring set not fitted', amount: '20.00' });
    // 20.00 before tax at 20 % takes 24.00 off (the server works it out; the spec only shows it).
    req.flush({ number: 'CRN-000002', invoiceNumber: 'INV-000007', total: '24.00' });
    await fixture.whenStable();
    expect(issued).toHaveBeenCalledTimes(1);
    expect(notifier.success).toHaveBeenCalledWith(
      expect.stringContaining('Credit note CRN-000002 issued'),
    );
    http.verify();
  });

  it('when the amount has three decimals, then nothing is sent and the field says why', () => {
    const { http, fixture, el } = render();
    el.querySelector<HTMLButtonElement>('button')?.click();
    fixture.detectChanges();
    type(el, 'reason', 'Price typed wrong');
    type(el, 'amount', '1.005');
    el.querySelector<HTMLFormElement>('form')?.dispatchEvent(new Event('submit'));
    fixture.detectChanges();
    http.expectNone('/api/jobs/job-1/invoice/credit-notes');
    expect(el.textContent).toContain('Digits with at most 2 decimals');
  });
});
