import { ChangeDetectionStrategy, Component, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

/** Takes trajectory files by drag and drop or from a file picker. */
@Component({
  selector: 'erg-drop-zone',
  imports: [MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="zone" [class.over]="over()" data-testid="drop-zone"
         (dragover)="onDragOver($event)" (dragleave)="over.set(false)" (drop)="onDrop($event)">
      <mat-icon aria-hidden="true">upload_file</mat-icon>
      <p><strong>Drop trajectory files here</strong> — XYZ, extended XYZ, PDB or H5MD, plain, .gz or .zip</p>
      <button mat-stroked-button type="button" (click)="picker.click()">Choose files…</button>
      <!-- Reached through the button above: kept out of the tab order and of assistive technology, so it is not met twice. -->
      <input #picker class="visually-hidden" type="file" multiple tabindex="-1" aria-hidden="true"
             (change)="onPicked(picker)">
    </div>
  `,
  styles: `
    .zone {
      display: flex; align-items: center; gap: 16px; flex-wrap: wrap;
      padding: 18px 20px; border: 2px dashed var(--mat-sys-outline-variant); border-radius: 12px;
      background: var(--mat-sys-surface-container-low); color: var(--mat-sys-on-surface-variant);
    }
    .zone.over { border-color: var(--mat-sys-primary); background: var(--mat-sys-primary-container); color: var(--mat-sys-on-primary-container); }
    p { margin: 0; flex: 1; min-width: 240px; }
  `,
})
export class DropZone {
  readonly files = output<File[]>();
  protected readonly over = signal(false);

  protected onDragOver(event: DragEvent): void {
    event.preventDefault();
    if (event.dataTransfer) event.dataTransfer.dropEffect = 'copy';
    this.over.set(true);
  }

  protected onDrop(event: DragEvent): void {
    event.preventDefault();
    this.over.set(false);
    const files = Array.from(event.dataTransfer?.files ?? []);
    if (files.length) this.files.emit(files);
  }

  protected onPicked(input: HTMLInputElement): void {
    const files = Array.from(input.files ?? []);
    input.value = '';
    if (files.length) this.files.emit(files);
  }
}
