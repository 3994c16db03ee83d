import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatSelectHarness } from '@angular/material/select/testing';

import { choicesOf, FilterSelect, SearchField } from './list-fields';

/** A list as the fields drive it, recording what they ask of it. */
class FakeList {
  readonly text = signal('QV');
  readonly filters = signal<Record<string, string>>({ kind: '', familyId: 'f1' });
  readonly searched: string[] = [];
  onSearch(value: string): void {
    this.searched.push(value);
    this.text.set(value);
  }
  setFilters(changes: Record<string, string>): void {
    this.filters.update((f) => ({ ...f, ...changes }));
  }
}

@Component({
  imports: [FilterSelect, SearchField],
  template: `
    <app-search-field
      label="Find a part"
      hint="Part number"
      [list]="list"
      (enter)="enters = enters + 1"
    />
    <app-filter-select
      label="Kind"
      [list]="list"
      field="kind"
      [choices]="kinds"
      (picked)="picked.push($event)"
    />
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly list = new FakeList();
  readonly kinds = [
    { value: '', label: 'All kinds' },
    ...choicesOf(['piston', 'rings'], (k) => (k === 'piston' ? 'Piston' : 'Ring set')),
  ];
  readonly picked: string[] = [];
  enters = 0;
}

describe('list fields', () => {
  let fixture: ComponentFixture<Host>;
  let root: HTMLElement;
  let input: HTMLInputElement;

  beforeEach(async () => {
    fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    root = fixture.nativeElement as HTMLElement;
    input = root.querySelector('app-search-field input') as HTMLInputElement;
  });

  it('when the search shows, then it carries the list’s text, its label and its hint', () => {
    expect(input.value).toBe('QV');
    expect(root.querySelector('app-search-field mat-label')?.textContent).toBe('Find a part');
    expect(root.querySelector('app-search-field mat-hint')?.textContent?.trim()).toBe(
      'Part number',
    );
  });

  it('when a key is typed and then Enter pressed, then the list gets the text and the page the Enter', () => {
    input.value = 'QV-54';
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter' }));
    expect(fixture.componentInstance.list.searched).toEqual(['QV-54']);
    expect(fixture.componentInstance.enters).toBe(1);
  });

  it('when another choice is picked, then that filter alone changes and the page is told', async () => {
    const select = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatSelectHarness);
    await select.open();
    expect(
      await Promise.all((await select.getOptions()).map((option) => option.getText())),
    ).toEqual(['All kinds', 'Piston', 'Ring set']);
    await select.clickOptions({ text: 'Ring set' });
    expect(fixture.componentInstance.list.filters()).toEqual({ kind: 'rings', familyId: 'f1' });
    expect(fixture.componentInstance.picked).toEqual(['rings']);
  });
});
