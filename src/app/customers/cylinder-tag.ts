import { ChangeDetectionStrategy, Component, input } from '@angular/core';

import type { LabelStock } from '../../../shared/label-stock';
import { Barcode } from '../ui/barcode';

/**
 * The tag label for a cylinder: the shop's mark as a Code 128 barcode and in words, with the
 * customer and family, on one label the size of the shop's label stock (62 × 35 mm on sheets).
 */
@Component({
  selector: 'app-cylinder-tag',
  imports: [Barcode],
  host: { '[class]': "'stock-' + stock()" },
  template: `
    <div class="tag" role="img" [attr.aria-label]="'Tag label for cylinder ' + mark()">
      <p class="mark">{{ mark() }}</p>
      <app-barcode class="code" [value]="mark()" />
      <p class="small">{{ familyCode() }} · {{ customerName() }}</p>
    </div>
  `,
  styleUrl: './cylinder-tag.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CylinderTag {
  readonly mark = input.required<string>();
  readonly familyCode = input.required<string>();
  readonly customerName = input.required<string>();
  readonly stock = input<LabelStock>('sheet');
}
