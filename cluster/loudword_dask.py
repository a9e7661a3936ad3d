#!/usr/bin/env python3
"""Runs a Loudword review as shard steps on a Dask cluster.

Called by `loudword review '<glob>' --dask ADDR` (extension/src/cli/review-with-dask.ts), which has
already written WORKDIR/settings.json (the settings, resolved once) and WORKDIR/shards.json (the
shard files). Round 1 (`loudword shard count`) and the sums rounds (`loudword shard sums`) run as
Dask tasks, one per shard; each task hands its step to its worker's `node bin/loudword.js shard
serve` process (one per worker, kept between tasks), which writes the partial into WORKDIR
atomically. Round 1 also keeps each shard's token counts in WORKDIR, so the sums rounds do not
tokenise again. The merge (`shard plan`) and `shard finish` run here. A worker
that dies mid-task has its task rerun elsewhere by the scheduler; a step that fails on its input
(an unparsable shard) fails the review with the step's own message, naming shard and line.

Workers need Node and the loudword package at the same path as here (or LOUDWORD_BIN set on the
worker to its bin/loudword.js), and WORKDIR readable and writable at the same path.
Prints progress to stderr ("loudword: ..." lines) and, last on stdout, one JSON line:
{"report": PATH} or {"error": MESSAGE}.
"""
import argparse
import json
import os
import resource
import subprocess
import sys
import time
import uuid

try:
    from distributed import Client, LocalCluster, as_completed, wait
except ImportError as missing:  # say what to install, in the driver's result line
    print(json.dumps({"error": f"this Python has no Dask distributed ({missing}): install python3-distributed python3-dask, "
                               "or point LOUDWORD_PYTHON at a Python that has it"}), flush=True)
    sys.exit(1)

NEEDS_SUMS = 10  # `shard finish`: the review needs another sums round (extension/src/cli/shard-command.ts)
MAX_SUMS_ROUNDS = 6
STRAGGLER_SECONDS = 120  # how long a failed round waits for its other steps before it reports


class ShardStepFailed(Exception):
    """A shard step that refused its input (exit status 1) or failed; carries its message."""


def run_step(node, loudword, args):
    """A Dask task: one shard step, run by this worker's `loudword shard serve` process (started on
    the worker's first step and kept, so a step pays neither Node's start-up nor loading the
    tokeniser's model). Returns the step's exit status (0, or NEEDS_SUMS), its wall time in seconds,
    the peak memory (RSS, MB) of the worker's Node process so far, and the worker's address."""
    import json as json_
    import subprocess as subprocess_
    import threading
    from distributed import get_worker

    def die_with_worker():
        # Linux: the Node process is killed when the worker that started it dies (prctl PR_SET_PDEATHSIG).
        try:
            import ctypes
            import signal
            ctypes.CDLL("libc.so.6", use_errno=True).prctl(1, signal.SIGKILL)
        except (OSError, AttributeError):
            pass

    program = os.environ.get("LOUDWORD_BIN", loudword)
    worker = get_worker()
    servers = worker.__dict__.setdefault("_loudword_servers", {})
    key = (threading.get_ident(), node, program)
    server = servers.get(key)
    if server is None or server.poll() is not None:
        server = subprocess_.Popen([node, program, "shard", "serve"], stdin=subprocess_.PIPE, stdout=subprocess_.PIPE,
                                   text=True, preexec_fn=die_with_worker)
        servers[key] = server
    start = time.monotonic()
    server.stdin.write(json_.dumps({"args": args}) + "\n")
    server.stdin.flush()
    line = server.stdout.readline()
    seconds = time.monotonic() - start
    if not line:
        servers.pop(key, None)
        raise ShardStepFailed(f"the worker's Node process ended during `shard {args[0]}` (exit status {server.wait()})")
    reply = json_.loads(line)
    if reply["status"] not in (0, NEEDS_SUMS):
        raise ShardStepFailed(reply.get("message") or f"exit status {reply['status']}")
    return reply["status"], seconds, reply["peakMB"], worker.address


def run_step_here(node, loudword, args):
    """A step run by the driver (merge, finish): its own `loudword shard ...` process. Returns its
    exit status (0, or NEEDS_SUMS), its wall time in seconds and its peak memory (RSS, MB)."""
    start = time.monotonic()
    done = subprocess.run([node, loudword, "shard", *args], capture_output=True, text=True)
    seconds = time.monotonic() - start
    peak_mb = resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024
    if done.returncode not in (0, NEEDS_SUMS):
        lines = [l for l in done.stderr.strip().splitlines() if l.strip()]
        message = lines[-1] if lines else f"exit status {done.returncode}"
        if message.startswith("loudword: "):
            message = message[len("loudword: "):]
        raise ShardStepFailed(message)
    return done.returncode, seconds, peak_mb


def say(quiet, text):
    if not quiet:
        print(f"loudword: {text}", file=sys.stderr, flush=True)


def run_round(client, name, node, loudword, commands, quiet, stats):
    """Submits one task per shard and waits for all, reporting progress as they finish."""
    token = uuid.uuid4().hex[:8]
    futures = [
        client.submit(run_step, node, loudword, args, key=f"loudword-{name}-{i}-{token}", pure=False)
        for i, args in enumerate(commands)
    ]
    done = 0
    started = time.monotonic()
    seconds = []
    for future in as_completed(futures):
        try:
            _, took, peak_mb, worker = future.result()  # raises the step's ShardStepFailed here
        except Exception:
            # The round's other steps may still be writing into WORKDIR. Let them end before the
            # failure is reported, so the caller can remove WORKDIR without racing a writer.
            try:
                wait(futures, timeout=STRAGGLER_SECONDS)
            except Exception:  # a timeout, or a worker lost meanwhile: report the first failure anyway
                pass
            raise
        seconds.append(took)
        stats["peakStepMB"] = max(stats.get("peakStepMB", 0), peak_mb)  # the largest worker's Node process
        peaks = stats.setdefault("workerPeakMB", {})
        peaks[worker] = max(peaks.get(worker, 0), peak_mb)
        done += 1
        say(quiet, f"{name}: {done}/{len(commands)} shards")
    stats.setdefault("rounds", []).append({"round": name, "wallSeconds": time.monotonic() - started,
                                           "stepSeconds": sorted(seconds)})


def local_step(node, loudword, args, stats, name):
    """A step run here (merge, finish), timed."""
    status, seconds, peak_mb = run_step_here(node, loudword, args)
    stats.setdefault("local", []).append({"step": name, "seconds": seconds})
    stats["peakLocalMB"] = max(stats.get("peakLocalMB", 0), peak_mb)
    return status


def review(client, workdir, node, loudword, quiet, stats):
    settings = os.path.join(workdir, "settings.json")
    with open(os.path.join(workdir, "shards.json"), encoding="utf-8") as f:
        shards = json.load(f)
    counts = [os.path.join(workdir, f"count-{i}.json") for i in range(len(shards))]
    # Round 1 keeps each shard's token counts; the sums rounds read them instead of tokenising again.
    kept = [os.path.join(workdir, f"counts-{i}.bin") for i in range(len(shards))]
    run_round(client, "round 1 (count)", node, loudword,
              [["count", s["file"], "--key", s["key"], "--settings", settings, "--out", out, "--counts", k]
               for s, out, k in zip(shards, counts, kept)],
              quiet, stats)
    plan = os.path.join(workdir, "plan-1.json")
    local_step(node, loudword, ["plan", *counts, "--settings", settings, "--out", plan], stats, "plan")
    say(quiet, "merged: vocabulary, idf and sample")
    report = os.path.join(workdir, "report.json")
    sums = []
    for r in range(1, MAX_SUMS_ROUNDS + 1):
        outs = [os.path.join(workdir, f"sums-{r}-{i}.json") for i in range(len(shards))]
        run_round(client, f"round {r + 1} (sums)", node, loudword,
                  [["sums", s["file"], "--key", s["key"], "--settings", settings, "--plan", plan, "--out", out, "--counts", k]
                   for s, out, k in zip(shards, outs, kept)],
                  quiet, stats)
        sums += outs
        next_plan = os.path.join(workdir, f"plan-{r + 1}.json")
        status = local_step(node, loudword, ["finish", *sums, "--settings", settings, "--plan", plan, "--out", report, "--next-plan", next_plan], stats, "finish")
        if status == 0:
            return report
        plan = next_plan
        say(quiet, "the review needs more from the shards (the suggested list's exact sums, or the verdict's neighbour search): one more round")
    raise ShardStepFailed(f"the review still needed more sums after {MAX_SUMS_ROUNDS} rounds")


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--scheduler", required=True, help='tcp://host:port, or "local" for a LocalCluster')
    parser.add_argument("--workdir", required=True)
    parser.add_argument("--loudword", required=True, help="path of bin/loudword.js")
    parser.add_argument("--node", default="node")
    parser.add_argument("--quiet", action="store_true")
    a = parser.parse_args()
    cluster = None
    try:
        if a.scheduler == "local":
            workers = int(os.environ.get("LOUDWORD_DASK_WORKERS", "2"))
            cluster = LocalCluster(n_workers=workers, threads_per_worker=1, processes=True, dashboard_address=None)
            client = Client(cluster)
        else:
            client = Client(a.scheduler, timeout=30)
        say(a.quiet, f"Dask: {len(client.scheduler_info()['workers'])} workers at {client.scheduler.address}")
        stats = {}
        try:
            report = review(client, a.workdir, a.node, a.loudword, a.quiet, stats)
        finally:
            client.close()
        with open(os.path.join(a.workdir, "stats.json"), "w", encoding="utf-8") as f:
            json.dump(stats, f)
        print(json.dumps({"report": report, "stats": stats}), flush=True)
        return 0
    except ShardStepFailed as e:
        print(json.dumps({"error": str(e)}), flush=True)
        return 1
    except OSError as e:
        print(json.dumps({"error": f"cannot reach the Dask scheduler {a.scheduler} ({e})"}), flush=True)
        return 1
    finally:
        if cluster is not None:
            cluster.close()


if __name__ == "__main__":
    sys.exit(main())
