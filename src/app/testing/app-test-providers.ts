import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, provideZonelessChangeDetection, type EnvironmentProviders, type Provider } from '@angular/core';
import { provideRouter, type Routes } from '@angular/router';

/** An empty page for routes a spec navigates to but does not look at. */
@Component({ template: '' })
export class BlankPage {}

/** Routes to empty pages at the given paths (or full route objects where a guard matters). */
export const blankRoutes = (...paths: (string | Routes[number])[]): Routes =>
  paths.map((path) => (typeof path === 'string' ? { path, component: BlankPage } : path));

/** What every component spec needs: zoneless change detection, HTTP answered by the spec, a router. */
export function appTestProviders(routes: Routes = []): (Provider | EnvironmentProviders)[] {
  return [provideZonelessChangeDetection(), provideHttpClient(), provideHttpClientTesting(), provideRouter(routes)];
}
