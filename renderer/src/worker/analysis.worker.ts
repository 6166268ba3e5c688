// The analysis worker: fits and resampling run here so the window never freezes.
import { serveJobs } from '../lib/workerProtocol';
import { jobHandlers } from './jobs';

serveJobs(self as unknown as Parameters<typeof serveJobs>[0], jobHandlers);
// The .xlsx reader is its own chunk (the command line loads it only for workbooks); fetched now,
// while the worker waits for the window's first file, it is ready when the demo arrives.
void import('../../../shared/import/readXlsx');
