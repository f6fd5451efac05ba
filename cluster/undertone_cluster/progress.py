"""Progress from the engine itself: the scheduler's Progress plugin (distributed.diagnostics), as
its dashboard and `distributed.progress` use it, printed as lines on stderr.

Debian 12 does not package bokeh, which the dashboard needs (the job starts the dashboard when
bokeh is there and prints its address). Without it, StageProgress subscribes to the same
scheduler feed the dashboard's progress bars read (ProgressBar.listen: tasks of a stage still to
run, and errors) in a thread of its own, and prints a line whenever the count changes.
"""
import sys
import threading
import time

from distributed.diagnostics.progressbar import ProgressBar
from distributed.utils import LoopRunner


class StageProgress(ProgressBar):
    """Prints `[undertone-cluster HH:MM:SS] <stage>: done/all tasks` as the scheduler reports them."""

    def __init__(self, client, stage, futures, interval="1s"):
        super().__init__(futures, scheduler=client.scheduler.address, interval=interval, complete=True)
        self.stage = stage
        self.last = None
        self.failed = None
        self.thread = threading.Thread(target=self._run, name=f"progress-{stage}", daemon=True)
        self.thread.start()

    def _run(self):
        try:
            LoopRunner(asynchronous=False).run_sync(self.listen)
        except Exception as e:  # progress is a report: a failure here must not stop the job, but is said
            self.failed = e
            print(f"[undertone-cluster] {self.stage}: no progress from the scheduler ({e})", file=sys.stderr, flush=True)

    def _draw_bar(self, remaining, all, **kwargs):
        done = all - remaining
        if done != self.last:
            self.last = done
            stamp = time.strftime("%H:%M:%S")
            print(f"[undertone-cluster {stamp}] {self.stage}: {done}/{all} tasks done (scheduler)", file=sys.stderr, flush=True)

    def stop(self, timeout=5):
        self.thread.join(timeout)
