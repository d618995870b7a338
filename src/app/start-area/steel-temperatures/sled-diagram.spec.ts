import { Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { SledDiagram, type SpotShown } from './sled-diagram';
import type { Spot, SpotKey, SpotPlan } from './steel-spots';

@Component({
  imports: [SledDiagram],
  template: `<rl-sled-diagram [readings]="readings()" [preset]="preset()" [selected]="selected()" (spotSelected)="tapped.push($event)" />`,
})
class Host {
  readonly readings = signal<ReadonlyMap<SpotKey, SpotShown>>(new Map());
  readonly preset = signal<SpotPlan | null>(null);
  readonly selected = signal<Spot | null>(null);
  readonly tapped: Spot[] = [];
}

function setUp(change: (host: Host) => void = () => undefined) {
  const fixture = TestBed.createComponent(Host);
  change(fixture.componentInstance);
  fixture.detectChanges();
  const element = fixture.nativeElement as HTMLElement;
  const spot = (key: string) => element.querySelector<HTMLButtonElement>(`button[data-spot="${key}"]`)!;
  const squash = (text: string | null | undefined) => text?.replace(/\s+/g, ' ').trim() ?? '';
  return { fixture, element, host: fixture.componentInstance, spot, squash };
}

describe('SledDiagram', () => {
  it('draws five spots on each steel, front first, each a button named for screen readers', () => {
    const { element, spot } = setUp();
    expect([...element.querySelectorAll('[data-steel="left"] button')].map((b) => b.getAttribute('data-spot'))).toEqual(['left-0', 'left-1', 'left-2', 'left-3', 'left-4']);
    expect(element.querySelectorAll('[data-steel="right"] button')).toHaveLength(5);
    expect(spot('right-4').getAttribute('aria-label')).toBe('Right steel, spot 5 of 5, from the front, not read');
  });

  it('emits the spot tapped', () => {
    const { host, spot } = setUp();
    spot('left-2').click();
    spot('right-0').click();
    expect(host.tapped).toEqual([
      { steel: 'left', spot: 2 },
      { steel: 'right', spot: 0 },
    ]);
  });

  it('shows a read value with its outcome in a mark and words, never by colour alone', () => {
    const { spot, squash } = setUp((host) =>
      host.readings.set(
        new Map<SpotKey, SpotShown>([
          ['left-1', { tenths: -42, outcome: 'pass' }],
          ['right-3', { tenths: 12, outcome: 'fail' }],
          ['right-0', { tenths: -5 }],
        ]),
      ),
    );
    expect(squash(spot('left-1').textContent)).toBe('Spot 2 −4.2 °C ✓ within');
    expect(squash(spot('right-3').textContent)).toBe('Spot 4 +1.2 °C ⚠ over');
    expect(spot('right-3').getAttribute('aria-label')).toBe('Right steel, spot 4 of 5, from the front, read +1.2 °C, over the limit');
    expect(squash(spot('right-0').textContent)).toBe('Spot 1 −0.5 °C ● read');
  });

  it('marks the selected spot with a pointer and aria-pressed, and only that one', () => {
    const { element, spot, squash } = setUp((host) => host.selected.set({ steel: 'right', spot: 2 }));
    expect(spot('right-2').getAttribute('aria-pressed')).toBe('true');
    expect(squash(spot('right-2').textContent)).toBe('▶ Spot 3');
    expect(element.querySelectorAll('button[aria-pressed="true"]')).toHaveLength(1);
  });

  it('says "read here" at the spots the athlete’s first sled was read, and explains it in the legend', () => {
    const { element, spot, squash } = setUp((host) => host.preset.set({ left: [1, 3], right: [0, 2] }));
    expect(squash(spot('left-3').textContent)).toBe('Spot 4 ◌ read here');
    expect(spot('left-3').getAttribute('aria-label')).toBe('Left steel, spot 4 of 5, from the front, read here, as on the first sled');
    expect(squash(spot('left-2').textContent)).toBe('Spot 3');
    expect(squash(element.querySelector('.legend')?.textContent)).toContain('◌ read here: where this athlete’s first sled in the run was read');
  });
});
