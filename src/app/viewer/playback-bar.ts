import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { MatSliderModule } from '@angular/material/slider';
import { MatTooltipModule } from '@angular/material/tooltip';
import { VIEWER_KEYS_HELP } from './viewer-keys';

/** Speeds offered, frames per second. */
export const PLAYBACK_SPEEDS = [1, 2, 5, 10, 15, 24, 30, 60] as const;

/** Play, pause, step and scrub through frames, and set the speed. */
@Component({
  selector: 'erg-playback-bar',
  imports: [MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule, MatSliderModule, MatTooltipModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="bar" role="group" aria-label="Playback">
      <button mat-icon-button type="button" (click)="stepBy.emit(-1)" [disabled]="frame() <= 0"
              aria-label="Previous frame" matTooltip="Previous frame">
        <mat-icon aria-hidden="true">skip_previous</mat-icon>
      </button>
      <button mat-flat-button class="play" type="button" (click)="togglePlay.emit()" [disabled]="total() < 2"
              [attr.aria-label]="playing() ? 'Pause' : 'Play'">
        <mat-icon aria-hidden="true">{{ playing() ? 'pause' : 'play_arrow' }}</mat-icon>
        {{ playing() ? 'Pause' : 'Play' }}
      </button>
      <button mat-icon-button type="button" (click)="stepBy.emit(1)" [disabled]="frame() >= total() - 1"
              aria-label="Next frame" matTooltip="Next frame">
        <mat-icon aria-hidden="true">skip_next</mat-icon>
      </button>
      <mat-slider class="scrub" [min]="0" [max]="lastFrame()" [step]="1" [disabled]="total() < 2">
        <input matSliderThumb [value]="frame()" (input)="scrub($event)"
               aria-label="Frame" [attr.aria-valuetext]="valueText()" />
      </mat-slider>
      <span class="counter" aria-hidden="true">{{ frame() + 1 }} / {{ total() }}</span>
      <mat-form-field class="speed" subscriptSizing="dynamic">
        <mat-label>Speed</mat-label>
        <mat-select [value]="fps()" (selectionChange)="fpsChange.emit($event.value)" aria-label="Playback speed in frames per second">
          @for (speed of speeds; track speed) {
            <mat-option [value]="speed">{{ speed }} frames/s</mat-option>
          }
        </mat-select>
      </mat-form-field>
      <button mat-icon-button type="button" [matTooltip]="keysHelp" [attr.aria-label]="keysHelp">
        <mat-icon aria-hidden="true">keyboard</mat-icon>
      </button>
    </div>
  `,
  styles: `
    .bar { display: flex; align-items: center; gap: 8px; flex-wrap: wrap; padding: 8px 12px;
      background: var(--mat-sys-surface-container-low); border-top: 1px solid var(--mat-sys-outline-variant); }
    .play { min-width: 104px; }
    .scrub { flex: 1 1 200px; min-width: 160px; }
    .counter { font-variant-numeric: tabular-nums; min-width: 10ch; text-align: right; color: var(--mat-sys-on-surface-variant); }
    .speed { width: 150px; }
  `,
})
export class PlaybackBar {
  /** Playhead, 0-based. */
  readonly frame = input.required<number>();
  readonly total = input.required<number>();
  readonly playing = input.required<boolean>();
  readonly fps = input.required<number>();

  readonly togglePlay = output<void>();
  readonly stepBy = output<number>();
  readonly seek = output<number>();
  readonly fpsChange = output<number>();

  protected readonly speeds = PLAYBACK_SPEEDS;
  protected readonly keysHelp = VIEWER_KEYS_HELP;
  protected readonly lastFrame = computed(() => Math.max(0, this.total() - 1));
  protected readonly valueText = computed(() => `Frame ${this.frame() + 1} of ${this.total()}`);

  protected scrub(event: Event): void {
    const value = (event.target as HTMLInputElement).valueAsNumber;
    if (Number.isFinite(value)) this.seek.emit(value);
  }
}
