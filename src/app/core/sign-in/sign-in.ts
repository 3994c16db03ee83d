import { HttpErrorResponse } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, Router } from '@angular/router';

import { apiErrorBody, apiErrorMessage } from '../api-error';
import { Session } from '../session';
import { RevealPassword } from '../../ui/reveal-password';
import { FormAlert } from '../../ui/form-alert';

/** The page a signed-out person lands on; after signing in they go back where they were headed. */
@Component({
  selector: 'app-sign-in',
  imports: [
    FormAlert,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    ReactiveFormsModule,
    RevealPassword,
  ],
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignIn {
  private readonly session = inject(Session);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });
  protected readonly busy = signal(false);
  protected readonly problem = signal('');

  protected submit(): void {
    if (this.busy()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { email, password } = this.form.getRawValue();
    this.busy.set(true);
    this.problem.set('');
    this.session.signIn(email.trim(), password).subscribe({
      next: () =>
        void this.router.navigateByUrl(safeNext(this.route.snapshot.queryParamMap.get('next'))),
      error: (error: unknown) => {
        this.busy.set(false);
        this.problem.set(describeFailure(error));
        this.form.controls.password.reset();
      },
    });
  }
}

function describeFailure(error: unknown): string {
  if (error instanceof HttpErrorResponse) {
    if (error.status === 401) {
      return 'Wrong e-mail or password.';
    }
    if (error.status === 429) {
      return (
        apiErrorBody(error)?.error.message ??
        'Too many attempts in a short time. Wait a few minutes, then try again.'
      );
    }
  }
  return apiErrorMessage(error);
}

/**
 * Only a path inside this app may follow sign-in: "//elsewhere" or "https://…" in `next` would
 * otherwise turn the sign-in page into a springboard to another site.
 */
export function safeNext(next: string | null): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) {
    return '/';
  }
  return next.startsWith('/sign-in') ? '/' : next;
}
