import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { clockOffsetMs, compareHybridTimes, formatHybridTime, parseHybridTime, receive, tick, type HybridTime } from './hybrid-clock';

const start = (node: string, wallMs = 0): HybridTime => ({ wallMs, counter: 0, node });

describe('hybrid logical clock (Kulkarni et al., 2014)', () => {
  it('when the wall clock stands still, then the counter orders local events', () => {
    const a = tick(start('a', 1000), 1000);
    const b = tick(a, 1000);
    expect(b).toEqual({ wallMs: 1000, counter: 2, node: 'a' });
  });

  it('when a message comes from a device whose clock is ahead, then the receiver orders its next event after it', () => {
    const ahead = tick(start('ahead'), 10_000_000);
    const behind = receive(start('behind', 5_000), ahead, 5_001);
    expect(compareHybridTimes(behind, ahead)).toBeGreaterThan(0);
    expect(compareHybridTimes(tick(behind, 5_002), behind)).toBeGreaterThan(0);
  });

  it('when any events are sent and received in any order, then each timestamp is later than all it has seen, and l never trails the physical clock', () => {
    // Kulkarni et al. (2014): e hb f ⇒ hlc(e) < hlc(f); l.j ≥ pt.j
    fc.assert(
      fc.property(
        fc.array(fc.record({ device: fc.integer({ min: 0, max: 2 }), from: fc.integer({ min: 0, max: 2 }), skew: fc.integer({ min: -300_000, max: 300_000 }), send: fc.boolean() }), { maxLength: 60 }),
        (events) => {
          const clocks = [start('d0'), start('d1'), start('d2')];
          let physical = 1_000_000;
          for (const e of events) {
            physical += 7;
            const pt = physical + e.skew;
            const before = clocks[e.device]!;
            const next = e.send ? tick(before, pt) : receive(before, clocks[e.from]!, pt);
            if (compareHybridTimes(next, before) <= 0) return false;
            if (!e.send && e.from !== e.device && compareHybridTimes(next, clocks[e.from]!) <= 0) return false;
            if (next.wallMs < pt) return false;
            clocks[e.device] = next;
          }
          return true;
        },
      ),
    );
  });

  it('when timestamps are written out, then string order is clock order and they read back the same', () => {
    fc.assert(
      fc.property(
        fc.record({ wallMs: fc.integer({ min: 0, max: 9e14 }), counter: fc.integer({ min: 0, max: 60_000_000 }), node: fc.constantFrom('a', 'b') }),
        fc.record({ wallMs: fc.integer({ min: 0, max: 9e14 }), counter: fc.integer({ min: 0, max: 60_000_000 }), node: fc.constantFrom('a', 'b') }),
        (x, y) => {
          const [sx, sy] = [formatHybridTime(x), formatHybridTime(y)];
          expect(parseHybridTime(sx)).toEqual(x);
          return Math.sign(compareHybridTimes(x, y)) === Math.sign(sx < sy ? -1 : sx > sy ? 1 : 0);
        },
      ),
    );
  });

  it('when a request takes 400 ms and the server stamped the middle, then the offset is the device clock error', () => {
    expect(clockOffsetMs(1_000_000, 1_180_000, 1_180_400)).toBe(180_200);
  });
});
