import { ChangeDetectionStrategy, Component, input } from '@angular/core';

import { Barcode } from '../ui/barcode';

/**
 * The tag label for a cylinder: the shop's mark as a Code 128 barcode and in words, with the
 * customer and family, on one 62 × 35 mm label (the size of the shop's other stickers).
 */
@Component({
  selector: 'app-cylinder-tag',
  imports: [Barcode],
  template: `
    <div class="tag" role="img" [attr.aria-label]="'Tag label for cylinder ' + mark()">
      <p class="mark">{{ mark() }}</p>
      <app-barcode class="code" [value]="mark()" />
      <p class="small">{{ familyCode() }} · {{ customerName() }}</p>
    </div>
  `,
  styles: `
    .tag {
      box-sizing: border-box;
      width: 62mm;
      height: 35mm;
      padding: 2mm 3mm;
      display: flex;
      flex-direction: column;
      justify-content: space-between;
      overflow: hidden;
      border: 1px solid #bbb;
      border-radius: 2mm;
      background: #fff;
      color: #000;
      font-family: 'IBM Plex Sans', system-ui, sans-serif;
    }
    p {
      margin: 0;
      white-space: nowrap;
      overflow: hidden;
      text-overflow: ellipsis;
    }
    .mark {
      font-size: 13pt;
      font-weight: 600;
    }
    .code {
      height: 14mm;
    }
    .small {
      font-size: 8pt;
    }
    @media print {
      .tag {
        border: 0;
        border-radius: 0;
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CylinderTag {
  readonly mark = input.required<string>();
  readonly familyCode = input.required<string>();
  readonly customerName = input.required<string>();
}
