import { provideZonelessChangeDetection, type Type } from '@angular/core';
import { TestBed } from '@angular/core/testing';

/** Text as a reader sees it: runs of white space as one space, trimmed. */
export const squash = (text: string | null | undefined): string => text?.replace(/\s+/g, ' ').trim() ?? '';

/**
 * Mounts a spec's host component around a step (zoneless, as the app runs), after `change` has set its
 * inputs, and gives the reads every step spec needs, each after a change detection.
 */
export function mountStep<T>(host: Type<T>, change: (host: T) => void = () => {}) {
  TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
  const fixture = TestBed.createComponent(host);
  change(fixture.componentInstance);
  fixture.detectChanges();
  const element = fixture.nativeElement as HTMLElement;
  const text = (selector: string) => {
    fixture.detectChanges();
    return squash(element.querySelector(selector)?.textContent);
  };
  const has = (selector: string) => {
    fixture.detectChanges();
    return element.querySelector(selector) !== null;
  };
  return { fixture, element, host: fixture.componentInstance, text, has };
}
