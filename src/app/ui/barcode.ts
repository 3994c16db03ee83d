import {
  afterRenderEffect,
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  input,
  viewChild,
} from '@angular/core';
import JsBarcode from 'jsbarcode';

/**
 * A Code 128 barcode drawn as SVG in the browser, so it prints sharp at any size. The quiet zone
 * on each side is ten module widths, the minimum ISO/IEC 15417 asks of Code 128.
 */
@Component({
  selector: 'app-barcode',
  template: `<svg #svg class="barcode" role="img" [attr.aria-label]="'Barcode ' + value()"></svg>`,
  styles: `
    :host {
      display: block;
    }
    .barcode {
      display: block;
      width: 100%;
      height: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Barcode {
  readonly value = input.required<string>();

  private readonly svg = viewChild.required<ElementRef<SVGSVGElement>>('svg');

  constructor() {
    afterRenderEffect(() => {
      const svg = this.svg().nativeElement;
      const moduleWidth = 2;
      JsBarcode(svg, this.value(), {
        format: 'CODE128',
        displayValue: false,
        width: moduleWidth,
        height: 60,
        margin: 0,
        marginLeft: 10 * moduleWidth,
        marginRight: 10 * moduleWidth,
        background: '#ffffff',
        lineColor: '#000000',
      });
      // Scale with the label: every bar grows by the same factor, so the code still reads.
      const width = svg.getAttribute('width')?.replace('px', '') ?? '0';
      const height = svg.getAttribute('height')?.replace('px', '') ?? '0';
      svg.setAttribute('viewBox', `0 0 ${width} ${height}`);
      svg.setAttribute('preserveAspectRatio', 'none');
      svg.removeAttribute('width');
      svg.removeAttribute('height');
      svg.removeAttribute('style');
    });
  }
}
