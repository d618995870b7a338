import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { describeProfile } from '../../../shared/rules/describe-profile';
import { describeLoadError } from '../core/describe-load-error';
import { competitionRulesResource } from './rules-api';

/** The rules in force for one competition: every value, its unit and where it comes from. */
@Component({
  selector: 'rl-rules-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButtonModule, RouterLink],
  templateUrl: './rules-page.html',
  styleUrl: './rules-page.scss',
})
export class RulesPage {
  /** From the route `competitions/:id/rules`. */
  readonly id = input.required<string>();
  protected readonly rules = competitionRulesResource(this.id);
  protected readonly sections = computed(() => (this.rules.hasValue() ? describeProfile(this.rules.value().profile) : []));
  protected readonly errorText = computed(() => {
    const error = this.rules.error();
    return error ? describeLoadError(error) : undefined;
  });
}
