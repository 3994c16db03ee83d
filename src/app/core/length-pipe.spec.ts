import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import Decimal from 'decimal.js';

import type { LengthJson } from '../../../shared/lengths';
import type { SessionResponse } from '../../../shared/session-types';
import { LengthPipe } from './length-pipe';
import { Session } from './session';

// Reference for the expected strings: decimal.js (an independent arbitrary-precision library from
// npm) rounding half-up to the trade resolution, 0.001 mm and 0.0001 in.
function reference(value: string, decimals: number): string {
  return new Decimal(value).toFixed(decimals, Decimal.ROUND_HALF_UP);
}

// 1 in = 25.4 mm exactly (international inch, NIST SP 811 appendix B). 2.5555 in × 25.4 = 64.9097 mm.
const BORE: LengthJson = { mm: '64.9097', in: '2.5555' };

function signedInAs(unit: 'mm' | 'in'): SessionResponse {
  return {
    user: { id: 'u1', email: 'mira@example.test', name: 'Mira Castellan', role: 'machinist', unit },
  };
}

@Component({
  imports: [LengthPipe],
  template: `<span class="plain">{{ value() | length }}</span>
    <span class="forced">{{ value() | length: 'in' }}</span>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly value = signal<LengthJson | null>(BORE);
}

describe('LengthPipe', () => {
  let session: Session;
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    session = TestBed.inject(Session);
    http = TestBed.inject(HttpTestingController);
  });

  async function signIn(unit: 'mm' | 'in'): Promise<void> {
    const loading = session.load();
    http.expectOne('/api/session').flush(signedInAs(unit));
    await loading;
  }

  function pipe(): LengthPipe {
    return TestBed.runInInjectionContext(() => new LengthPipe());
  }

  it('when the user reads millimetres, then it shows mm to 0.001 with the unit', async () => {
    await signIn('mm');
    expect(pipe().transform(BORE)).toBe(`${reference('64.9097', 3)} mm`);
    expect(pipe().transform(BORE)).toBe('64.910 mm');
  });

  it('when the user reads inches, then it shows in to 0.0001 with the unit', async () => {
    await signIn('in');
    expect(pipe().transform(BORE)).toBe(`${reference('2.5555', 4)} in`);
  });

  it('when a unit is given, then it wins over the user setting', async () => {
    await signIn('mm');
    expect(pipe().transform(BORE, 'in')).toBe('2.5555 in');
    expect(pipe().transform(BORE, 'mm')).toBe('64.910 mm');
  });

  it('when the value is null, then it shows a dash', async () => {
    await signIn('in');
    expect(pipe().transform(null)).toBe('—');
    expect(pipe().transform(undefined)).toBe('—');
  });

  it.each([
    // Each string is rounded on its own (no conversion happens here): these sit exactly on or
    // next to a half at the last kept digit, where a float-based rounding would slip.
    ['0.0005', '0.00002'],
    ['12.3455', '0.48604'],
    ['99.9995', '3.93699'],
    ['76.2', '3'], // 3 in = 76.2 mm exactly
    ['0.000001', '0.00001'],
  ])('when mm is %s and in is %s, then both match decimal.js half-up', async (mm, inches) => {
    await signIn('mm');
    const value = { mm, in: inches };
    expect(pipe().transform(value, 'mm')).toBe(`${reference(mm, 3)} mm`);
    expect(pipe().transform(value, 'in')).toBe(`${reference(inches, 4)} in`);
  });

  it('when the server sends something that is not a number, then it shows what was sent and reports it, without throwing', async () => {
    await signIn('mm');
    const logged = jest.spyOn(console, 'error').mockImplementation(() => undefined);
    expect(pipe().transform({ mm: 'abc', in: '1' })).toBe('abc mm');
    expect(logged).toHaveBeenCalledTimes(1);
    logged.mockRestore();
  });

  it('when a difference is negative, then it shows with a minus sign in either unit', async () => {
    // A step 0.12 mm short of the wear; 0.120 mm / 25.4 = 0.004724 in → 0.0047 in (1 in = 25.4 mm,
    // NIST SP 811), rounded half-up away from zero as decimal.js does for the positive value.
    await signIn('mm');
    const short: LengthJson = { mm: '-0.120', in: '-0.00472' };
    expect(pipe().transform(short)).toBe(`\u2212${reference('0.120', 3)} mm`);
    expect(pipe().transform(short, 'in')).toBe(`\u2212${reference('0.00472', 4)} in`);
    // Too small to show at the trade's resolution: zero, not "−0.000".
    expect(pipe().transform({ mm: '-0.0004', in: '-0.00002' })).toBe('0.000 mm');
  });

  it('when the user switches unit, then a rendered length follows at once', async () => {
    await signIn('mm');
    const fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    const text = (selector: string) =>
      (fixture.nativeElement as HTMLElement).querySelector(selector)?.textContent;
    expect(text('.plain')).toBe('64.910 mm');
    expect(text('.forced')).toBe('2.5555 in');

    session.updateUser({ ...signedInAs('in').user });
    await fixture.whenStable();
    expect(text('.plain')).toBe('2.5555 in');

    fixture.componentInstance.value.set(null);
    await fixture.whenStable();
    expect(text('.plain')).toBe('—');
  });
});
