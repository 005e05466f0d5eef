import { closeSync, openSync, writeSync } from 'node:fs';
import { join } from 'node:path';
import { parentPort, workerData } from 'node:worker_threads';
import type { StudyTask, StudyTaskName, StudyTaskReply } from '../src/cli/study-thread.js';

/**
 * Entry of a Node worker thread that does one part of a finished study for `strewn run` (started by
 * src/cli/study-thread.ts from the compiled dist/workers/): the analysis, the sensitivity, or the
 * landings files. The run's columns arrive in shared memory, so nothing is copied; the code is the
 * same as in the main thread (src/report/study.ts, src/report/result-data-files.ts), so are the
 * bytes. Tasks are answered one at a time, in the order they came.
 */
if (!parentPort) throw new Error('study-entry.js runs only as a worker thread');
const port = parentPort;

// The code of each task loads once, when first needed; that of the tasks this thread is meant
// for loads now, while the samples still fly. Only the analysis loads the geometry libraries.
const code = {
  analysis: () => import('../src/report/study.js'),
  sensitivity: () => import('../src/report/study-parts.js'),
  landings: () => import('../src/report/result-data-files.js'),
};
const loading = new Map<StudyTaskName, Promise<unknown>>();
function load<K extends StudyTaskName>(task: K): ReturnType<(typeof code)[K]> {
  if (!loading.has(task)) loading.set(task, code[task]());
  return loading.get(task) as ReturnType<(typeof code)[K]>;
}
const analysisSet = import('../src/analysis/from-run.js');
for (const task of (workerData as { preload?: StudyTaskName[] } | undefined)?.preload ?? []) void load(task).catch(() => {});

/**
 * A fault that tests inject: STREWN_TEST_THREAD_FAULT=throw:TASK makes the task fail,
 * slow:TASK makes the landings task wait 0.5 s after each piece it writes (so a signal can arrive
 * while it writes).
 */
const fault = /^(throw|slow):(analysis|sensitivity|landings)$/.exec(process.env.STREWN_TEST_THREAD_FAULT ?? '');

async function answer(task: StudyTask): Promise<StudyTaskReply> {
  if (fault?.[1] === 'throw' && fault[2] === task.task) throw new Error(`test fault in the ${task.task} task`);
  const { landingSetFromRun } = await analysisSet;
  switch (task.task) {
    case 'analysis': {
      const { studyAnalysis } = await load('analysis');
      return { analysis: studyAnalysis(task.scenario, task.run, landingSetFromRun(task.run, task.scenario)) };
    }
    case 'sensitivity': {
      const { studySpreadSensitivity } = await load('sensitivity');
      return { sensitivity: studySpreadSensitivity(task.scenario, task.run) };
    }
    case 'landings': {
      const { landingFiles } = await load('landings');
      const slow = fault?.[1] === 'slow' && fault[2] === 'landings';
      for (const [name, content] of landingFiles(task.scenario, landingSetFromRun(task.run, task.scenario))) {
        writePieces(join(task.folder, name), name, content, slow);
      }
      return { written: true };
    }
  }
}

/**
 * Writes a file's pieces with blocking calls: this thread has nothing else to do, and a blocking
 * write is over when the thread is stopped, so a cancelled run can remove the folder knowing that
 * no write of this thread comes after.
 */
function writePieces(file: string, name: string, content: string | Uint8Array | Iterable<string | Uint8Array>, slow: boolean): void {
  let fd: number;
  try {
    fd = openSync(file, 'w');
  } catch (error) {
    throw Object.assign(error as Error, { file: name });
  }
  try {
    const pieces = typeof content === 'string' || content instanceof Uint8Array ? [content] : content;
    for (const piece of pieces) {
      const bytes = typeof piece === 'string' ? Buffer.from(piece) : piece;
      for (let at = 0; at < bytes.length; ) at += writeSync(fd, bytes, at, bytes.length - at);
      if (slow) Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 500);
    }
  } catch (error) {
    throw Object.assign(error as Error, { file: name });
  } finally {
    closeSync(fd);
  }
}

// One task after another, so the replies come in the order of the tasks.
let queue: Promise<void> = Promise.resolve();
port.on('message', (task: StudyTask) => {
  queue = queue.then(() => answer(task)).then(
    (reply) => port.postMessage(reply),
    (error: unknown) => {
      const e = error as NodeJS.ErrnoException & { file?: string };
      port.postMessage({ error: e instanceof Error ? e.message : String(e), code: e?.code, file: e?.file });
    },
  );
});
