import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { HttpEventType } from '@angular/common/http';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import {
  catchError,
  EMPTY,
  finalize,
  interval,
  map,
  of,
  Subject,
  switchMap,
  takeUntil,
} from 'rxjs';

import {
  MAPPING_FIELD_NAMES,
  REQUIRED_MAPPING_FIELDS,
  type CommitJson,
  type DuplicateJson,
  type ImportJson,
  type ImportProgressJson,
  type MappingFieldName,
  type MappingJson,
  type SupplierJson,
} from '../../../shared/api/suppliers';
import { apiErrorBody, apiErrorMessage } from '../core/api-error';
import type { ErrorDetail } from '../../../shared/api/common';
import { ImportCommit } from './import-commit';
import { ImportPreview } from './import-preview';
import { ImportsApi } from './imports-api';
import { FIELD_NAMES } from './import-words';

const MAX_BYTES = 50 * 1024 * 1024;

interface Problem {
  message: string;
  details: ErrorDetail[];
}

/**
 * Brings a supplier's price list in: choose the supplier and the file, watch it upload and be read,
 * check the preview (format, counts, errors by line, first rows), correct the columns if needed,
 * then apply it.
 */
@Component({
  selector: 'app-import-upload',
  imports: [
    ImportCommit,
    ImportPreview,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
    RouterLink,
  ],
  templateUrl: './import-upload.html',
  styleUrl: './import-upload.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportUpload {
  private readonly api = inject(ImportsApi);
  private readonly destroyRef = inject(DestroyRef);

  /** Preselected supplier (from ?supplierId=). */
  readonly supplierId = input<string>();

  protected readonly fields = MAPPING_FIELD_NAMES;
  protected readonly fieldNames = FIELD_NAMES;
  protected readonly required = REQUIRED_MAPPING_FIELDS;

  protected readonly suppliers = toSignal(
    this.api.suppliers().pipe(
      map((page) => ({ ok: true as const, items: page.items })),
      catchError((error: unknown) => of({ ok: false as const, message: apiErrorMessage(error) })),
    ),
  );
  protected readonly supplierList = computed(() => {
    const s = this.suppliers();
    return s?.ok ? s.items : [];
  });

  protected readonly chosenSupplier = signal('');
  protected readonly file = signal<File | null>(null);
  protected readonly uploading = signal(false);
  protected readonly uploadPercent = signal(0);
  protected readonly uploaded = signal(false);
  private readonly serverProgress = signal<ImportProgressJson | null>(null);
  protected readonly problem = signal<Problem | null>(null);
  protected readonly preview = signal<ImportJson | null>(null);
  protected readonly duplicate = signal<DuplicateJson | null>(null);
  protected readonly result = signal<CommitJson | null>(null);
  /** Column names of the file and the mapping being edited, once the server has read the header. */
  protected readonly headers = signal<string[]>([]);
  protected readonly mapping = signal<MappingJson | null>(null);
  protected readonly mappingEdited = signal(false);

  protected readonly supplier = computed<SupplierJson | undefined>(() =>
    this.supplierList().find((s) => s.id === this.chosenSupplier()),
  );
  protected readonly missingRequired = computed(() => {
    const m = this.mapping();
    return m ? REQUIRED_MAPPING_FIELDS.filter((f) => !m[f]) : [];
  });

  constructor() {
    effect(() => {
      const preset = this.supplierId();
      if (preset) this.chosenSupplier.set(preset);
    });
  }

  protected serverText(): string {
    const p = this.serverProgress();
    if (!p || p.phase === 'waiting') return 'Waiting for the server to start reading…';
    if (p.phase === 'reading')
      return `Reading and checking rows: ${p.rows.toLocaleString('en')} so far`;
    if (p.phase === 'comparing') return "Comparing with the supplier's current prices…";
    return 'Finishing…';
  }

  protected onSupplier(id: string): void {
    this.chosenSupplier.set(id);
    this.reset();
  }

  protected onFile(event: Event): void {
    const inputEl = event.target as HTMLInputElement;
    const file = inputEl.files?.[0] ?? null;
    this.reset();
    this.mapping.set(null);
    this.headers.set([]);
    if (file && file.size > MAX_BYTES) {
      this.problem.set({
        message: `${file.name} is larger than 50 MB. Split the list, or leave out columns not needed.`,
        details: [],
      });
      this.file.set(null);
      inputEl.value = '';
      return;
    }
    this.file.set(file);
  }

  protected setField(field: MappingFieldName, column: string): void {
    const m = this.mapping();
    if (!m) return;
    this.mapping.set({ ...m, [field]: column === '' ? null : column });
    this.mappingEdited.set(true);
  }

  protected setUnit(unit: 'mm' | 'in'): void {
    const m = this.mapping();
    if (!m) return;
    this.mapping.set({ ...m, sizeUnit: unit });
    this.mappingEdited.set(true);
  }

  /** Uploads the file (again, with the edited mapping when there is one) and shows the preview. */
  protected read(withMapping = false): void {
    const file = this.file();
    const supplierId = this.chosenSupplier();
    if (!file || !supplierId || this.uploading()) return;
    const mapping = withMapping ? this.mapping() : null;
    this.reset();
    this.uploading.set(true);
    const token = crypto.randomUUID();
    const done = new Subject<void>();
    this.destroyRef.onDestroy(() => done.next());
    this.api
      .upload(supplierId, file, mapping, token)
      .pipe(finalize(() => done.next()))
      .subscribe({
        next: (event) => {
          if (event.type === HttpEventType.UploadProgress) {
            const total = event.total ?? file.size;
            this.uploadPercent.set(total ? Math.round((100 * event.loaded) / total) : 0);
            if (event.loaded >= total && !this.uploaded()) {
              this.uploaded.set(true);
              this.watchServer(token, done);
            }
          } else if (event.type === HttpEventType.Response) {
            this.uploading.set(false);
            const body = event.body;
            if (!body) return;
            if ('message' in body) {
              this.duplicate.set(body);
            } else {
              this.preview.set(body);
              this.headers.set(body.headers);
              this.mapping.set(body.mapping);
              this.mappingEdited.set(false);
            }
          }
        },
        error: (error: unknown) => {
          this.uploading.set(false);
          const body = apiErrorBody(error);
          this.problem.set({
            message: body?.error.message ?? apiErrorMessage(error),
            details: (body?.error.details ?? []).filter((d) => d.line !== undefined).slice(0, 20),
          });
          // A missing column: the server sends the header line and its proposal to correct.
          const extra = (
            error as { error?: { error?: { headers?: string[]; mapping?: MappingJson } } }
          ).error?.error;
          if (extra?.headers && extra.mapping) {
            this.headers.set(extra.headers);
            this.mapping.set(extra.mapping);
          }
        },
      });
  }

  protected onCommitted(answer: CommitJson | DuplicateJson): void {
    if (answer.status === 'duplicate') this.duplicate.set(answer);
    else this.result.set(answer);
  }

  private watchServer(token: string, done: Subject<void>): void {
    interval(400)
      .pipe(
        takeUntil(done),
        switchMap(() => this.api.progress(token).pipe(catchError(() => EMPTY))),
      )
      .subscribe((p) => this.serverProgress.set(p));
  }

  private reset(): void {
    this.problem.set(null);
    this.preview.set(null);
    this.duplicate.set(null);
    this.result.set(null);
    this.uploadPercent.set(0);
    this.uploaded.set(false);
    this.serverProgress.set(null);
  }
}
