import type { Page } from 'playwright-core';
import { expect } from 'vitest';

// The glove-first measures of the e2e tests: target sizes and gaps, and text contrast, read in Chromium.

export interface Box {
  label: string;
  x: number;
  y: number;
  width: number;
  height: number;
}

/** Every button, and every link drawn as a button, that is on the screen. */
export async function buttonBoxes(page: Page): Promise<Box[]> {
  return page.locator('button, a.mat-mdc-button-base').evaluateAll((buttons) =>
    buttons
      .map((b) => {
        const r = b.getBoundingClientRect();
        return { label: b.textContent?.trim().replace(/\s+/g, ' ') ?? '', x: r.x, y: r.y, width: r.width, height: r.height };
      })
      .filter((box) => box.width > 0 && box.height > 0),
  );
}

/** At least 64 x 64 CSS px each, and at least 12 px between any two. */
export function expectGloveSized(boxes: Box[]): void {
  for (const box of boxes) {
    expect(box.height, `${box.label} height`).toBeGreaterThanOrEqual(64);
    expect(box.width, `${box.label} width`).toBeGreaterThanOrEqual(64);
  }
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      expect(gapBetween(boxes[i]!, boxes[j]!), `${boxes[i]!.label} to ${boxes[j]!.label}`).toBeGreaterThanOrEqual(12);
    }
  }
}

/** Smallest distance between the edges of two boxes (0 when they touch or overlap). */
export function gapBetween(a: Box, b: Box): number {
  const dx = Math.max(0, Math.max(a.x, b.x) - Math.min(a.x + a.width, b.x + b.width));
  const dy = Math.max(0, Math.max(a.y, b.y) - Math.min(a.y + a.height, b.y + b.height));
  return Math.hypot(dx, dy);
}

/**
 * What the contrast check reads of an element in the page. Spelled out because this file is also
 * type-checked with the server's settings, which have no DOM types.
 */
interface PaintedElement {
  parentElement: PaintedElement | null;
  ownerDocument: { defaultView: { getComputedStyle(element: PaintedElement): { color: string; backgroundColor: string } } | null };
}

/** WCAG 2.x contrast ratio of a text element against the first opaque background behind it. */
export async function contrastOf(page: Page, selector: string): Promise<number> {
  return page.locator(selector).first().evaluate((target) => {
    const element = target as unknown as PaintedElement;
    const styleOf = (e: PaintedElement) => e.ownerDocument.defaultView!.getComputedStyle(e);
    const parse = (css: string) => {
      const m = css.match(/rgba?\(([^)]+)\)/);
      if (!m) throw new Error(`unreadable colour ${css}`);
      const [r, g, b, a = 1] = m[1]!.split(/[ ,/]+/).filter(Boolean).map(Number);
      return { r: r!, g: g!, b: b!, a };
    };
    const luminance = ({ r, g, b }: { r: number; g: number; b: number }) => {
      const lin = (c: number) => {
        const s = c / 255;
        return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
      };
      return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
    };
    let node: PaintedElement | null = element;
    let background = { r: 255, g: 255, b: 255, a: 1 };
    while (node) {
      const bg = parse(styleOf(node).backgroundColor);
      if (bg.a === 1) {
        background = bg;
        break;
      }
      node = node.parentElement;
    }
    const text = luminance(parse(styleOf(element).color));
    const back = luminance(background);
    return (Math.max(text, back) + 0.05) / (Math.min(text, back) + 0.05);
  });
}
