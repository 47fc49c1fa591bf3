// The entry each worker thread loads: looks the task up by name and runs it.
import { tasks, type TaskName } from "./tasks.js";

export default function runTask({ task, input }: { task: TaskName; input: unknown }): unknown {
  const fn = tasks[task] as ((input: unknown) => unknown) | undefined;
  if (!fn) throw new Error(`Unknown worker task: ${String(task)}`);
  return fn(input);
}
