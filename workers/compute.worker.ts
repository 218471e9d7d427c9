/**
 * Worker thread of the server's compute pool (server/compute/pool.ts, piscina): one task of
 * lib/compute in, its reply out. It runs the same lib/analysis and lib/tensiometry code the
 * request thread ran before, so results are the same to the last bit; OpenCV loads once per
 * thread, on its first analysis.
 */
import { runComputeTask } from '../lib/compute/tasks';

export default runComputeTask;
