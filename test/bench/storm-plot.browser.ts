// Storm plot benchmark in Chromium: one drag step of a key point on a 2,000-reading event (move, recompute
// baseflow, figures and every method, redraw) against a redraw alone, and a 100,000-reading hydrograph
// drawn with its baseflow and shading against the bare series, each pair measured in the same run.
// Prints JSON lines; asserts nothing. Run: node --import tsx test/bench/storm-plot.browser.ts
import { openTestPage } from '../support/browser/pages/build';
import { emit, sig3 } from './measure';

const { page, close } = await openTestPage(4435, 'plot.html');
try {
  const drag = await page.evaluate(() => window.freshetPlotTest.dragStep(2000, 41));
  emit({
    name: 'storm-drag-step-recompute-redraw-2000-ms', value: sig3(drag.drag_ms), target: '< 16', unit: 'ms', readings: 2000, steps: 41,
    includes: 'move the end of runoff, variable-slope baseflow and summary, every method, plot update and draw',
  });
  emit({ name: 'storm-drag-step-to-redraw-alone-ratio', value: sig3(drag.drag_ms / drag.redraw_ms), target: 'informative', drag_ms: sig3(drag.drag_ms), redraw_ms: sig3(drag.redraw_ms) });
  const render = await page.evaluate(() => window.freshetPlotTest.render(100_000, 9));
  emit({ name: 'storm-plot-render-100k-with-baseflow-ms', value: sig3(render.withBaseflow_ms), target: '< 100', unit: 'ms', readings: 100_000, runs: 9 });
  emit({ name: 'storm-plot-render-100k-to-bare-ratio', value: sig3(render.withBaseflow_ms / render.bare_ms), target: 'informative', with_baseflow_ms: sig3(render.withBaseflow_ms), bare_ms: sig3(render.bare_ms) });
} finally {
  await close();
}
