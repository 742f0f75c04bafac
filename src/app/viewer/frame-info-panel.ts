import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';

/** Where the playback is and what the system looks like there. */
@Component({
  selector: 'erg-frame-info-panel',
  imports: [DecimalPipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section aria-labelledby="frame-info-heading">
      <h2 id="frame-info-heading">This frame</h2>
      <dl>
        <dt>Frame</dt><dd class="frame-number">{{ frame() + 1 }} / {{ total() }}</dd>
        <dt>Time</dt>
        <dd>
          @if (!loaded()) { loading… } @else if (timePs() === null) { not stated } @else { {{ timePs() | number: '1.0-4' }} ps }
        </dd>
        <dt>Atoms</dt><dd>{{ atoms() | number }}</dd>
        <dt>Cell</dt>
        <dd>
          @if (!loaded()) {
            loading…
          } @else if (cellLengths(); as lengths) {
            a {{ lengths[0] | number: '1.2-2' }} · b {{ lengths[1] | number: '1.2-2' }} · c {{ lengths[2] | number: '1.2-2' }} Å
          } @else {
            none stated
          }
        </dd>
      </dl>
    </section>
  `,
  styleUrl: './viewer-panel.scss',
})
export class FrameInfoPanel {
  /** 0-based index of the frame on screen. */
  readonly frame = input.required<number>();
  readonly total = input.required<number>();
  /** False until the frame on screen has arrived. */
  readonly loaded = input.required<boolean>();
  readonly timePs = input.required<number | null>();
  readonly atoms = input.required<number>();
  readonly cellLengths = input.required<readonly [number, number, number] | null>();
}
