import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';

import type { HomeJson } from '../../../shared/api/home';

/** The home page's one door to the server: the day's work for the signed-in role. */
@Injectable({ providedIn: 'root' })
export class HomeApi {
  private readonly http = inject(HttpClient);

  summary(): Observable<HomeJson> {
    return this.http.get<HomeJson>('/api/home');
  }
}
