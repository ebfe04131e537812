/**
 * jsdom draws nothing: uPlot needs a 2D context, Path2D and matchMedia, the last already when it
 * is imported. Import this module first in a test file. The stubs draw and record nothing (the
 * tests check data and behaviour, not pixels) and stay for the whole file, because uPlot may
 * finish a queued redraw after a test's cleanup.
 */
const noop = () => {};
const context = new Proxy({} as Record<string | symbol, unknown>, {
  get: (target, prop) => (prop in target ? target[prop] : prop === 'measureText' ? () => ({ width: 10 }) : noop),
});

class Path2DStub {
  moveTo() {}
  lineTo() {}
  rect() {}
  arc() {}
  closePath() {}
  bezierCurveTo() {}
  addPath() {}
}

const media = () => ({ matches: false, addEventListener: noop, removeEventListener: noop, addListener: noop, removeListener: noop });

Object.assign(globalThis, { Path2D: Path2DStub, matchMedia: media });
HTMLCanvasElement.prototype.getContext = (() => context) as unknown as HTMLCanvasElement['getContext'];
