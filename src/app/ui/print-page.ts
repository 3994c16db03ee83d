import { DOCUMENT } from '@angular/common';
import { DestroyRef, inject } from '@angular/core';

/**
 * Sets the printed page's size and margins for as long as the calling page is open (a sheet of
 * stickers on A4 or Letter, or one label per page on a label printer), and removes it after.
 * Must be called in an injection context.
 */
export function printPageRule(): (css: string) => void {
  const document = inject(DOCUMENT);
  const style = document.createElement('style');
  style.setAttribute('data-print-page', '');
  document.head.appendChild(style);
  inject(DestroyRef).onDestroy(() => style.remove());
  return (css: string) => {
    style.textContent = `@media print { @page { ${css} } }`;
  };
}
