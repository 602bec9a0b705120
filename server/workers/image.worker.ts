/**
 * Entry point of an image worker thread (piscina). One task at a time per thread; the
 * pool in imagePool.ts bounds how many threads, how much heap each may use, and how
 * long a task may take.
 */
import {
  flattenImage,
  processImage,
  type FlattenResult,
  type ImageTask,
  type ProcessResult,
} from './imageTasks';

export default async function run(task: ImageTask): Promise<ProcessResult | FlattenResult> {
  switch (task.op) {
    case 'process':
      return processImage(task);
    case 'flatten':
      return flattenImage(task);
  }
}
