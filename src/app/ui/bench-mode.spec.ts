import { TestBed } from '@angular/core/testing';

import { BenchMode } from './bench-mode';

describe('BenchMode', () => {
  const realMatchMedia = globalThis.matchMedia;

  function withPointer(coarse: boolean): void {
    globalThis.matchMedia = ((query: string) => ({
      matches: coarse && query === '(pointer: coarse)',
      media: query,
      addEventListener: () => undefined,
      removeEventListener: () => undefined,
    })) as unknown as typeof matchMedia;
  }

  beforeEach(() => {
    localStorage.clear();
    TestBed.resetTestingModule();
  });
  afterEach(() => {
    globalThis.matchMedia = realMatchMedia;
  });

  it('when the pointer is a finger and nobody chose, then the bench layout is on', () => {
    withPointer(true);
    expect(TestBed.inject(BenchMode).on()).toBe(true);
  });

  it('when the pointer is a mouse and nobody chose, then the desk layout stays', () => {
    withPointer(false);
    expect(TestBed.inject(BenchMode).on()).toBe(false);
  });

  it('when a person turns it off on a tablet, then it stays off on this device next time', () => {
    withPointer(true);
    TestBed.inject(BenchMode).set(false);
    expect(localStorage.getItem('stepstock.benchMode')).toBe('off');
    TestBed.resetTestingModule();
    expect(TestBed.inject(BenchMode).on()).toBe(false);
  });

  it('when a person turns it on at a desk, then it is on', () => {
    withPointer(false);
    const bench = TestBed.inject(BenchMode);
    bench.set(true);
    expect(bench.on()).toBe(true);
  });
});
