import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  inject,
  Injectable,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

const KEY = 'stepstock.benchMode';

type Choice = 'on' | 'off' | null;

function readChoice(): Choice {
  try {
    const v = localStorage.getItem(KEY);
    return v === 'on' || v === 'off' ? v : null;
  } catch {
    return null;
  }
}

/**
 * The bench layout for a tablet at the machine: large targets, large figures, one cylinder at a
 * time. On by itself where the pointer is a finger (`pointer: coarse`), and a person's own choice
 * on this device (kept in the browser) overrides that either way.
 */
@Injectable({ providedIn: 'root' })
export class BenchMode {
  private readonly choice = signal<Choice>(readChoice());
  private readonly coarse = signal(false);

  readonly on = computed(() => {
    const choice = this.choice();
    return choice === null ? this.coarse() : choice === 'on';
  });

  constructor() {
    const query = typeof matchMedia === 'function' ? matchMedia('(pointer: coarse)') : null;
    if (query) {
      this.coarse.set(query.matches);
      const follow = (e: MediaQueryListEvent) => this.coarse.set(e.matches);
      query.addEventListener?.('change', follow);
      inject(DestroyRef).onDestroy(() => query.removeEventListener?.('change', follow));
    }
  }

  set(on: boolean): void {
    const choice: Choice = on ? 'on' : 'off';
    this.choice.set(choice);
    try {
      localStorage.setItem(KEY, choice);
    } catch {
      // A browser that keeps nothing (private mode) still switches for this visit.
    }
  }
}

/** The switch between the desk layout and the bench layout, in a page's header. */
@Component({
  selector: 'app-bench-mode-toggle',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <button
      mat-stroked-button
      type="button"
      class="bench-toggle no-print"
      [attr.aria-pressed]="bench.on()"
      (click)="bench.set(!bench.on())"
    >
      <mat-icon>{{ bench.on() ? 'desktop_windows' : 'tablet' }}</mat-icon>
      {{ bench.on() ? 'Desk layout' : 'Bench layout' }}
    </button>
  `,
  styles: `
    .bench-toggle {
      min-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BenchModeToggle {
  protected readonly bench = inject(BenchMode);
}
