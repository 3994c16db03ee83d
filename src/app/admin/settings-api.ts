import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';

import type { ShopSettingsJson } from '../../../shared/api/settings';

/** The shop's settings: read by everyone, changed by the owner. */
@Injectable({ providedIn: 'root' })
export class SettingsApi {
  private readonly http = inject(HttpClient);

  get(): Observable<ShopSettingsJson> {
    return this.http.get<ShopSettingsJson>('/api/settings');
  }

  save(changes: Partial<ShopSettingsJson>): Observable<ShopSettingsJson> {
    return this.http.patch<ShopSettingsJson>('/api/settings', changes);
  }
}
