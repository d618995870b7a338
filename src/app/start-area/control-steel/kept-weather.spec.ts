import { forgetWeather, keepWeather, keptWeatherMaxAgeMs, readKeptWeather } from './kept-weather';

const race = '0190a7e2-0000-7000-8000-000000000001';
const other = '0190a7e2-0000-7000-8000-000000000002';
const at = Date.parse('2027-01-09T09:00:00.000Z');

describe('kept ice and air', () => {
  beforeEach(() => localStorage.clear());

  it('comes back for the same competition after the app was killed, and not for another', () => {
    keepWeather(race, { ice: -75, air: null }, at);
    expect(readKeptWeather(race, at + 60_000)).toEqual({ ice: -75, air: null });
    expect(readKeptWeather(other, at + 60_000)).toEqual({ ice: null, air: null });
  });

  it('is dropped once older than a reading could use it, and once forgotten', () => {
    keepWeather(race, { ice: -75, air: -40 }, at);
    expect(readKeptWeather(race, at + keptWeatherMaxAgeMs)).toEqual({ ice: -75, air: -40 });
    expect(readKeptWeather(race, at + keptWeatherMaxAgeMs + 1)).toEqual({ ice: null, air: null });
    forgetWeather(race);
    expect(readKeptWeather(race, at)).toEqual({ ice: null, air: null });
  });

  it('ignores what this app cannot read', () => {
    localStorage.setItem(`rimelog.control-steel.weather.${race}`, '{"ice":"cold"}');
    expect(readKeptWeather(race, at)).toEqual({ ice: null, air: null });
  });
});
