// The window's entry. The analysis worker is started before the window's own code is loaded:
// its code then loads and compiles on the worker's thread while this thread loads the screens,
// instead of after them (measured on the demo in chromium: the worker was ready 0.26 s after
// the window's code had run, most of the wait for the first optimum).
import './app.css';

// One worker for all heavy analysis; Vite bundles it as its own module.
const worker = new Worker(new URL('./worker/analysis.worker.ts', import.meta.url), {
  type: 'module',
});

void import('./startWindow').then(({ startWindow }) => startWindow(worker));
