import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { trackTypeLabel, type CompetitionSummary } from '../../../shared/competition/competition';
import { AuthStore } from '../auth/auth-store';
import { describeLoadError } from '../core/describe-load-error';
import { competitionListResource } from './competitions-api';

const statusLabels: Record<CompetitionSummary['status'], string> = {
  planned: 'Planned',
  open: 'Open',
  closed: 'Closed',
};

/** Home screen: the competitions this server knows, one glove-sized refresh away. */
@Component({
  selector: 'rl-competitions-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, MatButtonModule, MatTableModule, RouterLink],
  templateUrl: './competitions-page.html',
  styleUrl: './competitions-page.scss',
})
export class CompetitionsPage {
  protected readonly list = competitionListResource();
  protected readonly auth = inject(AuthStore);
  protected readonly columns = ['name', 'trackType', 'level', 'venue', 'firstRunOn', 'status', 'rules', 'start'];
  protected readonly competitions = computed(() =>
    this.list.hasValue() ? this.list.value().competitions : [],
  );
  protected readonly errorText = computed(() => {
    const error = this.list.error();
    return error ? describeLoadError(error) : undefined;
  });
  protected readonly trackTypeLabel = trackTypeLabel;
  protected statusLabel(competition: CompetitionSummary): string {
    return statusLabels[competition.status];
  }
}
