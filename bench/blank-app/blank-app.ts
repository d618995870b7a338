import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';

/** One Material button on the same theme and fonts as Rimelog, nothing else. */
@Component({
  selector: 'bench-blank-root',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  template: `<button mat-flat-button type="button" (click)="presses.set(presses() + 1)">Pressed {{ presses() }} times</button>`,
})
export class BlankApp {
  protected readonly presses = signal(0);
}
