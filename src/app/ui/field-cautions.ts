import { ChangeDetectionStrategy, Component } from '@angular/core';

/** The cautions every screen carries: people decide, instruments calibrated, steels handled gently. */
@Component({
  selector: 'rl-field-cautions',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p><strong>The rulebook in force and the technical delegate decide.</strong>
      Rimelog computes and records; it never rules on a sled by itself.</p>
    <ul>
      <li>Use only calibrated instruments, each for its own purpose.</li>
      <li>Handle steel edges gently: touch the pyrometer to the side of the steel.</li>
      <li>A sled without its safety equipment does not start.</li>
    </ul>
  `,
  host: { class: 'field-cautions', role: 'note', 'aria-label': 'Cautions' },
  styles: `
    :host {
      display: block;
      padding: 16px;
      border-top: 2px solid var(--mat-sys-outline);
      font-size: 1rem;
      line-height: 1.5;
    }
    p { margin: 0 0 8px; }
    ul { margin: 0; padding-left: 1.25rem; }
  `,
})
export class FieldCautions {}
