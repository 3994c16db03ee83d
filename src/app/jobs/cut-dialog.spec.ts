import { TestBed } from '@angular/core/testing';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';

import { CutDialog, type CutDialogData } from './cut-dialog';

describe('CutDialog', () => {
  function render(data: CutDialogData) {
    const close = jest.fn();
    TestBed.configureTestingModule({
      providers: [
        { provide: MAT_DIALOG_DATA, useValue: data },
        { provide: MatDialogRef, useValue: { close } },
      ],
    });
    const fixture = TestBed.createComponent(CutDialog);
    fixture.detectChanges();
    return { fixture, close, element: fixture.nativeElement as HTMLElement };
  }

  function button(element: HTMLElement, text: string): HTMLButtonElement {
    const found = Array.from(element.querySelectorAll('button')).find((b) =>
      b.textContent?.includes(text),
    );
    if (!found) throw new Error(`no button "${text}"`);
    return found;
  }

  it('when a cut is to be marked, then the dialog says what it locks and how long it can be taken back', () => {
    const { element, close } = render({
      mode: 'cut',
      cylinder: 2,
      pistonLabel: 'PU-000123',
      reasonNeeded: false,
    });
    const text = element.textContent?.replace(/\s+/g, ' ') ?? '';
    expect(text).toContain('Mark cylinder 2 as cut?');
    expect(text).toContain('its bore readings and its oversize step are locked');
    expect(text).toContain('PU-000123 stays with this bore');
    expect(text).toContain('within 10 minutes; after that only the owner can, with a reason');
    button(element, 'Mark as cut').click();
    expect(close).toHaveBeenCalledWith({ reason: '' });
  });

  it('when the owner takes a cut back, then the button waits for a reason and passes it on', async () => {
    const { element, close, fixture } = render({
      mode: 'undo',
      cylinder: 1,
      pistonLabel: 'PU-000123',
      reasonNeeded: true,
    });
    const take = button(element, 'Take back the cut');
    expect(take.disabled).toBe(true);
    const field = element.querySelector('textarea') as HTMLTextAreaElement;
    field.value = 'Marked on the wrong cylinder';
    field.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(take.disabled).toBe(false);
    take.click();
    expect(close).toHaveBeenCalledWith({ reason: 'Marked on the wrong cylinder' });
  });

  it('when the person cancels, then nothing is answered', () => {
    const { element, close } = render({
      mode: 'cut',
      cylinder: 1,
      pistonLabel: 'PU-1',
      reasonNeeded: false,
    });
    button(element, 'Cancel').click();
    expect(close).toHaveBeenCalledWith(null);
  });
});
