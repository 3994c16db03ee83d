import { TestBed } from '@angular/core/testing';
import { MatDialog } from '@angular/material/dialog';
import { firstValueFrom } from 'rxjs';

import { CameraScanDialog, cameraProblem } from './camera-scan';

// The reader is replaced so the test decides what the "camera" sees; the dialog's own handling of
// the answer, the refusal and the camera's release is what is under test.
type Callback = (text: string) => void;
const reader = {
  callback: null as Callback | null,
  stop: jest.fn(),
  fail: null as unknown,
};
jest.mock('./code128-scan', () => ({
  scanCode128(_c: unknown, _v: unknown, callback: Callback) {
    if (reader.fail) return Promise.reject(reader.fail);
    reader.callback = callback;
    return Promise.resolve({ stop: reader.stop });
  },
}));

function named(name: string): Error {
  const e = new Error('refused');
  e.name = name;
  return e;
}

describe('cameraProblem', () => {
  it('when permission is refused, then it says so and points to the typed field', () => {
    const text = cameraProblem(named('NotAllowedError'), true, true);
    expect(text).toMatch(/permission was refused/);
    expect(text).toMatch(/Type the label into the field/);
  });

  it('when there is no camera, then it says none was found', () => {
    expect(cameraProblem(named('NotFoundError'), true, true)).toMatch(/No camera was found/);
  });

  it('when the page is not on HTTPS, then it says the camera needs HTTPS', () => {
    expect(cameraProblem(new Error('x'), false, false)).toMatch(/only when .* over HTTPS/);
  });
});

describe('CameraScanDialog', () => {
  const original = Object.getOwnPropertyDescriptor(navigator, 'mediaDevices');

  beforeEach(() => {
    reader.callback = null;
    reader.fail = null;
    reader.stop.mockClear();
    Object.defineProperty(navigator, 'mediaDevices', { value: {}, configurable: true });
    TestBed.configureTestingModule({});
  });

  afterEach(() => {
    if (original) Object.defineProperty(navigator, 'mediaDevices', original);
    else delete (navigator as { mediaDevices?: unknown }).mediaDevices;
  });

  async function settle() {
    for (let i = 0; i < 3; i++) {
      await new Promise((r) => setTimeout(r));
      TestBed.tick();
    }
  }

  it('when the camera reads a label, then the dialog closes with it and the camera stops', async () => {
    const ref = TestBed.inject(MatDialog).open(CameraScanDialog);
    const closed = firstValueFrom(ref.afterClosed());
    await settle();
    expect(reader.callback).not.toBeNull();
    reader.callback?.('  ');
    reader.callback?.(' PU-000255 ');
    expect(await closed).toBe('PU-000255');
    expect(reader.stop).toHaveBeenCalled();
  });

  it('when the dialog is closed without a read, then the camera stops', async () => {
    const ref = TestBed.inject(MatDialog).open(CameraScanDialog);
    await settle();
    expect(reader.callback).not.toBeNull();
    ref.close();
    await settle();
    expect(reader.stop).toHaveBeenCalledTimes(1);
  });

  it('when the camera is refused, then the message is shown instead of the picture', async () => {
    reader.fail = named('NotAllowedError');
    TestBed.inject(MatDialog).open(CameraScanDialog);
    await settle();
    const alert = document.querySelector('.camera-scan [role="alert"]');
    expect(alert?.textContent).toMatch(/permission was refused/);
    expect(document.querySelector('.camera-scan video')).toBeNull();
  });
});
