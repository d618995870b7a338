import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { OfflineState } from '../core/offline-readiness';
import { OfflineBadge } from './offline-badge';

function render(state: OfflineState): HTMLElement {
  TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
  const fixture = TestBed.createComponent(OfflineBadge);
  fixture.componentRef.setInput('state', state);
  fixture.detectChanges();
  return fixture.nativeElement as HTMLElement;
}

describe('OfflineBadge', () => {
  it('when the shell is cached, then it says "Ready offline" in words, not only in colour', () => {
    const badge = render('ready');
    expect(badge.textContent).toContain('Ready offline');
    expect(badge.textContent).toContain('✓');
    expect(badge.classList).toContain('is-ready');
    expect(badge.getAttribute('role')).toBe('status');
  });

  it('when the worker is still caching, then it does not claim to be ready', () => {
    const badge = render('caching');
    expect(badge.textContent).toContain('Saving the app for offline use');
    expect(badge.classList).not.toContain('is-ready');
  });

  it('when running a development build, then it warns that it will not open offline', () => {
    expect(render('dev-build').textContent).toContain('not available offline');
  });
});
