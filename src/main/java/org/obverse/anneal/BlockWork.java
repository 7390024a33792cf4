package org.obverse.anneal;

import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;

/**
 * How the samplers split their reads over threads: units of work (64-read blocks, or groups of
 * them) handed out one at a time to at most {@code threads} workers, each with its own
 * workspace. Every unit's output depends only on its index, so the result never depends on the
 * thread count.
 */
final class BlockWork {
    private BlockWork() {
    }

    /** Work on one unit with a thread's own workspace. */
    interface Task {
        Object workspace();

        /** Units of work for the blocks: one block a unit unless a task groups them. */
        default int units(int blocks) {
            return blocks;
        }

        void block(int unit, Object workspace);
    }

    /** Runs every unit over at most {@code threads} workers; each unit is done by one thread. */
    static void run(Task task, int units, int threads) {
        int workers = Math.min(threads, units);
        if (workers <= 1) {
            Object ws = task.workspace();
            for (int b = 0; b < units; b++) {
                task.block(b, ws);
            }
            return;
        }
        AtomicInteger next = new AtomicInteger();
        AtomicReference<Throwable> failure = new AtomicReference<>();
        Thread[] pool = new Thread[workers];
        for (int w = 0; w < workers; w++) {
            pool[w] = new Thread(() -> {
                try {
                    Object ws = task.workspace();
                    for (int b = next.getAndIncrement(); b < units && failure.get() == null; b = next.getAndIncrement()) {
                        task.block(b, ws);
                    }
                } catch (Throwable t) {
                    failure.compareAndSet(null, t);
                }
            }, "obverse-sampler-" + w);
            pool[w].setDaemon(true);
            pool[w].start();
        }
        for (Thread t : pool) {
            try {
                t.join();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("sampling was interrupted", e);
            }
        }
        Throwable t = failure.get();
        if (t instanceof RuntimeException) {
            throw (RuntimeException) t;
        }
        if (t instanceof Error) {
            throw (Error) t;
        }
    }
}
