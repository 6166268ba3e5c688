// The analysis worker: fits and resampling run here so the window never freezes.
import { serveJobs } from '../lib/workerProtocol';
import { jobHandlers } from './jobs';

serveJobs(self as unknown as Parameters<typeof serveJobs>[0], jobHandlers);
