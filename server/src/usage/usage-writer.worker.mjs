// The entry of the usage log's writer thread (see WorkerUsageWriter), in plain JavaScript so that the
// thread starts without a TypeScript loader: it registers tsx for this thread, then runs the writer.
import { register } from 'tsx/esm/api';

register();
await import('./usage-writer.thread.ts');
