import { Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { AnswerPair } from './answer-pair';

@Component({
  imports: [AnswerPair],
  template: `<rl-answer-pair [answer]="answer()" [yes]="{ label: 'Present', mark: '✓', name: 'present' }" (answered)="given.push($event); answer.set($event)" />`,
})
class Host {
  readonly answer = signal<boolean | null>(null);
  readonly given: boolean[] = [];
}

function setUp() {
  const fixture = TestBed.createComponent(Host);
  fixture.detectChanges();
  const element = fixture.nativeElement as HTMLElement;
  const button = (name: string) => element.querySelector<HTMLButtonElement>(`button[data-answer="${name}"]`)!;
  const tap = (name: string) => {
    button(name).click();
    fixture.detectChanges();
  };
  return { host: fixture.componentInstance, button, tap };
}

describe('AnswerPair', () => {
  it('shows both answers with their marks and words, neither pressed while unanswered', () => {
    const { button } = setUp();
    expect(button('present').textContent?.trim()).toBe('✓ Present');
    expect(button('no').textContent?.trim()).toBe('✕ No');
    expect(button('present').getAttribute('aria-pressed')).toBe('false');
    expect(button('no').getAttribute('aria-pressed')).toBe('false');
  });

  it('emits the answer tapped and shows it pressed; tapping it again emits nothing, the other answer does', () => {
    const { host, button, tap } = setUp();
    tap('no');
    tap('no');
    expect(button('no').getAttribute('aria-pressed')).toBe('true');
    expect(button('no').classList).toContain('pressed');
    tap('present');
    expect(host.given).toEqual([false, true]);
    expect(button('present').getAttribute('aria-pressed')).toBe('true');
    expect(button('no').getAttribute('aria-pressed')).toBe('false');
  });
});
