package org.obverse.campaign;

import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.IntConsumer;

/**
 * Runs the jobs of a campaign step on a pool of daemon threads, one job a thread at a time,
 * and returns their results in the order given — so what the caller writes never depends on
 * which thread finished first. A job's unchecked or I/O exception is rethrown as it was.
 */
final class JobThreads {
    /** One job's work. */
    @FunctionalInterface
    interface Work<T> {
        T run(int k) throws IOException;
    }

    private JobThreads() {
    }

    /**
     * Runs work(0) … work(count − 1) on at most threads threads.
     *
     * @param what names the threads and an interruption's message ("sampling", "collecting")
     * @param tick told the number of jobs done so far (from any thread), or null
     */
    static <T> List<T> run(String what, int count, int threads, IntConsumer tick, Work<T> work) throws IOException {
        List<T> out = new ArrayList<>(count);
        if (count == 0) {
            return out;
        }
        AtomicInteger done = new AtomicInteger();
        ExecutorService pool = Executors.newFixedThreadPool(Math.max(1, Math.min(threads, count)), runnable -> {
            Thread t = new Thread(runnable, "campaign-" + what);
            t.setDaemon(true);
            return t;
        });
        try {
            List<Future<T>> futures = new ArrayList<>(count);
            for (int k = 0; k < count; k++) {
                int job = k;
                futures.add(pool.submit(() -> {
                    T result = work.run(job);
                    if (tick != null) {
                        tick.accept(done.incrementAndGet());
                    }
                    return result;
                }));
            }
            for (Future<T> f : futures) {
                out.add(f.get());
            }
            return out;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IOException("interrupted while " + what, e);
        } catch (ExecutionException e) {
            Throwable c = e.getCause();
            if (c instanceof RuntimeException re) {
                throw re;
            }
            if (c instanceof IOException io) {
                throw io;
            }
            if (c instanceof Error err) {
                throw err;
            }
            throw new IllegalStateException(c);
        } finally {
            pool.shutdownNow();
        }
    }
}
