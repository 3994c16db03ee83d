import { NgTemplateOutlet } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  contentChild,
  input,
  output,
  TemplateRef,
} from '@angular/core';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

/**
 * A search box that offers what it found as you type (a customer, a part): the finder owns the
 * searching, this field the look. Each offer is drawn by the `<ng-template let-item>` inside it;
 * the hint says what may be typed, or why nothing is offered. The box empties once an offer is
 * picked (the finder shows the pick beside it). A list page's plain search box is `SearchField` in
 * `list-fields.ts`.
 */
@Component({
  selector: 'app-offer-search',
  imports: [
    MatAutocompleteModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    NgTemplateOutlet,
  ],
  template: `
    <mat-form-field appearance="outline" class="search-field" subscriptSizing="dynamic">
      <mat-label>{{ label() }}</mat-label>
      <mat-icon matPrefix>{{ icon() }}</mat-icon>
      <input
        matInput
        type="search"
        autocomplete="off"
        [value]="text()"
        [matAutocomplete]="auto"
        (input)="typed.emit($any($event.target).value)"
        (keydown.enter)="entered.emit($event)"
      />
      <mat-autocomplete
        #auto="matAutocomplete"
        [displayWith]="blank"
        (optionSelected)="chosen.emit($event.option.value)"
      >
        @for (item of items(); track item.id) {
          <mat-option [value]="item">
            <ng-container *ngTemplateOutlet="offer(); context: { $implicit: item }" />
          </mat-option>
        }
      </mat-autocomplete>
      @if (problem()) {
        <mat-hint class="problem">{{ problem() }}</mat-hint>
      } @else {
        <mat-hint>{{ hint() }}</mat-hint>
      }
    </mat-form-field>
  `,
  styles: `
    .search-field {
      width: 100%;
    }
    .problem {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class OfferSearch<T extends { id: string }> {
  readonly label = input.required<string>();
  /** The Material symbol before the text: person_search, barcode_scanner… */
  readonly icon = input.required<string>();
  /** What may be typed, shown while there is no problem to tell. */
  readonly hint = input.required<string>();
  readonly text = input.required<string>();
  readonly items = input.required<readonly T[]>();
  /** Why nothing is offered ("Nothing found for …", a failed search), or ''. */
  readonly problem = input('');

  readonly typed = output<string>();
  readonly entered = output<Event>();
  readonly chosen = output<T>();

  protected readonly offer = contentChild.required(TemplateRef);
  /** The box shows the text typed, never the offer picked. */
  protected readonly blank = (): string => '';
}
