import { HttpParams } from '@angular/common/http';

/**
 * A list's query as URL parameters, leaving out what is not set (undefined, null or ""), so the
 * server applies its own defaults rather than reading "undefined" as a filter.
 */
export function queryParams(query: object): HttpParams {
  let result = new HttpParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== null && value !== '') {
      result = result.set(key, String(value));
    }
  }
  return result;
}
