import { inject, Pipe, PipeTransform } from '@angular/core';

import { formatInSeriesUnit, type LengthJson, type LengthUnit } from '../../../shared/lengths';
import { Session } from './session';

/**
 * A size in the unit its price list or step series is defined in, with the person's own unit
 * beside it when it differs: `{{ row.oversize | seriesLength: 'mm' : true }}` reads
 * "+0.50 mm (0.0197 in)" for an inch user. null shows "—"; a pipe never throws.
 */
@Pipe({ name: 'seriesLength', pure: false })
export class SeriesLengthPipe implements PipeTransform {
  private readonly session = inject(Session);

  transform(value: LengthJson | null | undefined, seriesUnit: LengthUnit, signed = false): string {
    if (value === null || value === undefined) return '—';
    try {
      return formatInSeriesUnit(value, seriesUnit, this.session.unit(), { signed });
    } catch (error) {
      console.error('SeriesLengthPipe: not a length from the API', value, error);
      return `${seriesUnit === 'in' ? value.in : value.mm} ${seriesUnit}`;
    }
  }
}
