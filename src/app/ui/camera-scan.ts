import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  ElementRef,
  inject,
  input,
  output,
  signal,
  viewChild,
  afterNextRender,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';

/** What to tell the person when the camera cannot be used, in words, with what still works. */
export function cameraProblem(error: unknown, secure: boolean, hasMediaDevices: boolean): string {
  const name = error instanceof Error || error instanceof DOMException ? error.name : '';
  const typeInstead = 'Type the label into the field instead (a barcode scanner works there too).';
  if (!hasMediaDevices) {
    return secure
      ? `This browser cannot use a camera. ${typeInstead}`
      : `The camera works only when Stepstock is opened over HTTPS. ${typeInstead}`;
  }
  if (name === 'NotAllowedError' || name === 'SecurityError') {
    return `The camera may not be used: permission was refused (the browser's site settings can allow it). ${typeInstead}`;
  }
  if (name === 'NotFoundError' || name === 'OverconstrainedError') {
    return `No camera was found on this device. ${typeInstead}`;
  }
  if (name === 'NotReadableError' || name === 'AbortError') {
    return `The camera is busy in another app or could not start. ${typeInstead}`;
  }
  return `The camera could not start. ${typeInstead}`;
}

/**
 * Reads one Code 128 label (piston, bin or cylinder tag) from the device's camera and closes with
 * its text. The camera is stopped when the dialog closes, however it closes.
 */
@Component({
  selector: 'app-camera-scan-dialog',
  imports: [MatButtonModule, MatDialogModule, MatIconModule, MatProgressBarModule],
  template: `
    <h2 mat-dialog-title>Scan a label with the camera</h2>
    <mat-dialog-content class="camera-scan">
      @if (problem(); as message) {
        <div class="form-alert" role="alert">
          <mat-icon>no_photography</mat-icon>
          <span>{{ message }}</span>
        </div>
      } @else {
        @if (starting()) {
          <mat-progress-bar mode="indeterminate" aria-label="Starting the camera" />
        }
        <p class="hint" aria-live="polite">
          Hold the label flat, about a hand's width from the camera, barcode across the picture.
        </p>
        <video #video class="preview" muted playsinline aria-label="Camera picture"></video>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-stroked-button type="button" mat-dialog-close>Close</button>
    </mat-dialog-actions>
  `,
  styles: `
    .camera-scan {
      display: flex;
      flex-direction: column;
      gap: 8px;
      min-width: min(480px, 80vw);
    }
    .preview {
      width: 100%;
      max-height: 60vh;
      background: #000;
      border-radius: 8px;
    }
    .hint {
      margin: 0;
    }
    button {
      min-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CameraScanDialog {
  private readonly dialogRef = inject<MatDialogRef<CameraScanDialog, string>>(MatDialogRef);
  private readonly video = viewChild<ElementRef<HTMLVideoElement>>('video');

  protected readonly starting = signal(true);
  protected readonly problem = signal('');
  private stop: (() => void) | null = null;
  private closed = false;

  constructor() {
    // Released as soon as closing starts (Escape, Close, a read), and again if it is destroyed.
    this.dialogRef.beforeClosed().subscribe(() => this.release());
    inject(DestroyRef).onDestroy(() => this.release());
    afterNextRender(() => void this.start());
  }

  private async start(): Promise<void> {
    const video = this.video()?.nativeElement;
    const hasMediaDevices = typeof navigator !== 'undefined' && !!navigator.mediaDevices;
    if (!video || !hasMediaDevices) {
      this.fail(new Error('no media devices'), hasMediaDevices);
      return;
    }
    try {
      // Loaded only when a person asks for the camera: the reader is not needed anywhere else.
      // Our labels are Code 128 only; reading that one format is faster and misreads less.
      const { scanCode128 } = await import('./code128-scan');
      const controls = await scanCode128(
        { video: { facingMode: { ideal: 'environment' } }, audio: false },
        video,
        (read) => {
          const text = read.trim();
          if (text) {
            this.release();
            this.dialogRef.close(text);
          }
        },
      );
      if (this.closed) controls.stop();
      else this.stop = () => controls.stop();
      this.starting.set(false);
    } catch (error: unknown) {
      this.fail(error, true);
    }
  }

  private fail(error: unknown, hasMediaDevices: boolean): void {
    this.starting.set(false);
    this.problem.set(cameraProblem(error, globalThis.isSecureContext !== false, hasMediaDevices));
  }

  private release(): void {
    this.closed = true;
    this.stop?.();
    this.stop = null;
  }
}

/**
 * "Scan with camera" beside a field a label can be typed (or wedge-scanned) into: opens the camera
 * dialog and emits the label read. The field keeps working whatever the camera does.
 */
@Component({
  selector: 'app-camera-scan-button',
  imports: [MatButtonModule, MatIconModule],
  template: `
    <button
      mat-stroked-button
      type="button"
      class="camera-scan-button"
      [disabled]="disabled()"
      (click)="open()"
    >
      <mat-icon>photo_camera</mat-icon>
      Scan with camera
    </button>
  `,
  styles: `
    .camera-scan-button {
      min-height: 48px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CameraScanButton {
  private readonly dialog = inject(MatDialog);

  readonly disabled = input(false);
  readonly scanned = output<string>();

  protected open(): void {
    this.dialog
      .open<CameraScanDialog, void, string>(CameraScanDialog, { autoFocus: 'dialog' })
      .afterClosed()
      .subscribe((text) => {
        if (text) this.scanned.emit(text);
      });
  }
}
