import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import type { Me } from '../../../shared/auth/auth-api';
import type { CompetitionList } from '../../../shared/competition/competition';
import { AuthStore } from '../auth/auth-store';
import { firstOfficial, raceId } from '../auth/testing/auth-fixtures';
import { CompetitionsPage } from './competitions-page';

const twoRaces: CompetitionList = {
  competitions: [
    {
      id: '0193a5c0-0000-7000-8000-0000000000a1',
      name: 'Test Night Sprint',
      trackType: 'natural',
      level: 'national',
      venue: 'Test Road',
      firstRunOn: '2027-01-09',
      status: 'open',
    },
    {
      id: '0193a5c0-0000-7000-8000-0000000000a2',
      name: 'Test Junior Cup',
      trackType: 'artificial',
      level: 'junior',
      venue: 'Test Channel',
      firstRunOn: '2027-02-06',
      status: 'planned',
    },
  ],
};

async function setUp(me: Me | null = null) {
  TestBed.configureTestingModule({
    providers: [provideZonelessChangeDetection(), provideHttpClient(), provideHttpClientTesting(), provideRouter([])],
  });
  if (me) TestBed.inject(AuthStore).adoptSession(me);
  const fixture = TestBed.createComponent(CompetitionsPage);
  const http = TestBed.inject(HttpTestingController);
  const harnesses = TestbedHarnessEnvironment.loader(fixture);
  // Runs the resource's effect so the request goes out; stability comes only once it is answered.
  TestBed.tick();
  return { fixture, http, harnesses };
}

describe('CompetitionsPage', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('when the server sends competitions, then each is a table row in words', async () => {
    const { fixture, http, harnesses } = await setUp();
    http.expectOne('/api/competitions').flush(twoRaces);
    await fixture.whenStable();

    const table = await harnesses.getHarness(MatTableHarness);
    const rows = await table.getCellTextByColumnName();
    expect(rows['name']?.text).toEqual(['Test Night Sprint', 'Test Junior Cup']);
    expect(rows['trackType']?.text).toEqual(['Natural track', 'Artificial track']);
    expect(rows['firstRunOn']?.text).toEqual(['9 Jan 2027', '6 Feb 2027']);
    expect(rows['status']?.text).toEqual(['Open', 'Planned']);
    expect(rows['rules']?.text).toEqual(['Rules', 'Not open yet']);
  });

  it('when the official holds a role in an open competition, then its start-area screens are one tap away; elsewhere a dash', async () => {
    localStorage.clear();
    const { fixture, http, harnesses } = await setUp(firstOfficial);
    http.expectOne('/api/competitions').flush(twoRaces);
    await fixture.whenStable();

    const rows = await (await harnesses.getHarness(MatTableHarness)).getCellTextByColumnName();
    expect(rows['start']?.text).toEqual(['Control steelStart checksCourtesy checks', '—']);
    const links = [...(fixture.nativeElement as HTMLElement).querySelectorAll<HTMLAnchorElement>('.start-links a')].map((a) => a.getAttribute('href'));
    expect(links).toEqual([`/competitions/${raceId}/start/control-steel`, `/competitions/${raceId}/start/checks`, `/competitions/${raceId}/start/courtesy`]);
    localStorage.clear();
  });

  it('when the server cannot be reached, then the official is told so and can refresh', async () => {
    const { fixture, http, harnesses } = await setUp();
    http.expectOne('/api/competitions').error(new ProgressEvent('error'), { status: 0 });
    await fixture.whenStable();

    const alert: HTMLElement = fixture.nativeElement.querySelector('[role="alert"]');
    expect(alert.textContent).toContain('cannot be reached from this device');
    expect(await harnesses.getAllHarnesses(MatTableHarness)).toHaveLength(0);

    const refresh = await harnesses.getHarness(MatButtonHarness.with({ text: 'Refresh list' }));
    expect(await refresh.isDisabled()).toBe(false);
    // A harness click waits for stability, which the new pending request would hold off: click directly.
    (fixture.nativeElement.querySelector('button.primary-action') as HTMLButtonElement).click();
    TestBed.tick();
    http.expectOne('/api/competitions').flush(twoRaces);
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('[role="alert"]')).toBeNull();
    expect(await (await harnesses.getHarness(MatTableHarness)).getRows()).toHaveLength(2);
  });

  it('when the server sends a list this version cannot read, then it says to update the app', async () => {
    const { fixture, http } = await setUp();
    http.expectOne('/api/competitions').flush({ competitions: [{ name: 'no id' }] });
    await fixture.whenStable();
    const alert: HTMLElement = fixture.nativeElement.querySelector('[role="alert"]');
    expect(alert.textContent).toContain('Update the app at the hut');
  });

  it('when there are no competitions, then the empty state says who creates them', async () => {
    const { fixture, http } = await setUp();
    http.expectOne('/api/competitions').flush({ competitions: [] });
    await fixture.whenStable();
    expect(fixture.nativeElement.textContent).toContain('No competitions yet. An organiser creates them.');
  });
});
