import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { CompetitionRulesProfile } from '../../../shared/rules/competition-profile';
import { acceptDemoValues } from '../../../shared/rules/profile-values';
import { shippedProfile } from '../../../shared/rules/shipped-profiles';
import { RulesPage } from './rules-page';

const competitionId = '0193a5c0-0000-7000-8000-0000000000a1';
const frozen: CompetitionRulesProfile = {
  competitionId,
  frozenAt: '2027-01-09T07:00:00.000Z',
  profile: acceptDemoValues(shippedProfile('natural', 'national')),
};

function setUp() {
  TestBed.configureTestingModule({
    providers: [provideZonelessChangeDetection(), provideHttpClient(), provideHttpClientTesting(), provideRouter([])],
  });
  const fixture = TestBed.createComponent(RulesPage);
  fixture.componentRef.setInput('id', competitionId);
  TestBed.tick();
  return { fixture, http: TestBed.inject(HttpTestingController), element: fixture.nativeElement as HTMLElement };
}

describe('RulesPage', () => {
  afterEach(() => TestBed.inject(HttpTestingController).verify());

  it('when the frozen profile arrives, then every value shows with its source, and who decides is said', async () => {
    const { fixture, http, element } = setUp();
    http.expectOne(`/api/competitions/${competitionId}/rules-profile`).flush(frozen);
    await fixture.whenStable();

    expect(element.querySelector('h1')?.textContent).toContain('Rules in force: Natural track, national');
    expect(element.querySelector('.frozen')?.textContent).toContain('9 Jan 2027, 07:00');
    expect(element.querySelector('.decides')?.textContent).toContain('The rulebook in force and the technical delegate decide');
    const rows = [...element.querySelectorAll('.row')].map((row) => [...row.children].map((cell) => cell.textContent?.trim()).join(' | '));
    expect(rows).toContain('Steel may be warmer than the control steel by at most | +5.0 °C | trade practice, no published source · verified');
    expect(rows).toContain('Sled maximum weight, doubles | 26.0 kg | demo value, not a rule value: invented for the demo race · not verified');
  });

  it('when the competition has not opened, then the server message is shown as a problem', async () => {
    const { fixture, http, element } = setUp();
    http
      .expectOne(`/api/competitions/${competitionId}/rules-profile`)
      .flush({ error: { code: 'conflict', message: '"Test Cup" has not opened yet.', details: [] } }, { status: 409, statusText: 'Conflict' });
    await fixture.whenStable();
    expect(element.querySelector('[role="alert"]')?.textContent).toContain('Could not load the rules.');
  });
});
