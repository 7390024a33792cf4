package org.obverse.campaign;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.List;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.Test;
import org.obverse.testsupport.QuietTest;

/** The campaign's thread pool: results in the order given, whoever finishes first, and failures as they were. */
class JobThreadsTest extends QuietTest {
    @Test
    void resultsComeInTheOrderGivenWhenLaterJobsFinishFirst() throws IOException {
        // Job 0 waits until the last job has finished, so completion order is the reverse of the list order.
        int count = 6;
        CountDownLatch lastDone = new CountDownLatch(1);
        List<Integer> out = JobThreads.run("testing", count, 3, null, k -> {
            if (k == 0) {
                try {
                    assertThat(lastDone.await(10, TimeUnit.SECONDS)).isTrue();
                } catch (InterruptedException e) {
                    throw new IOException(e);
                }
            }
            if (k == count - 1) {
                lastDone.countDown();
            }
            return k * k;
        });
        assertThat(out).containsExactly(0, 1, 4, 9, 16, 25);
    }

    @Test
    void usesNoMoreThreadsThanAskedAndTicksEveryJob() throws IOException {
        Set<String> threads = ConcurrentHashMap.newKeySet();
        AtomicInteger ticks = new AtomicInteger();
        AtomicInteger highest = new AtomicInteger();
        List<String> out = JobThreads.run("testing", 40, 2, n -> {
            ticks.incrementAndGet();
            highest.accumulateAndGet(n, Math::max);
        }, k -> {
            threads.add(Thread.currentThread().getName() + "@" + System.identityHashCode(Thread.currentThread()));
            assertThat(Thread.currentThread().isDaemon()).isTrue();
            assertThat(Thread.currentThread().getName()).isEqualTo("campaign-testing");
            return "job" + k;
        });
        assertThat(out).hasSize(40).startsWith("job0", "job1").endsWith("job39");
        assertThat(threads.size()).isBetween(1, 2);
        assertThat(ticks.get()).isEqualTo(40);
        assertThat(highest.get()).isEqualTo(40);
    }

    @Test
    void noJobsRunNothing() throws IOException {
        AtomicInteger ran = new AtomicInteger();
        assertThat(JobThreads.run("testing", 0, 2, null, k -> ran.incrementAndGet())).isEmpty();
        assertThat(ran.get()).isZero();
    }

    @Test
    void aJobsExceptionIsRethrownAsItWas() {
        IllegalArgumentException unchecked = new IllegalArgumentException("bad job 3");
        assertThatThrownBy(() -> JobThreads.run("testing", 5, 2, null, k -> {
            if (k == 3) {
                throw unchecked;
            }
            return k;
        })).isSameAs(unchecked);
        IOException io = new IOException("disk gone");
        assertThatThrownBy(() -> JobThreads.run("testing", 5, 2, null, k -> {
            if (k == 1) {
                throw io;
            }
            return k;
        })).isSameAs(io);
        UncheckedIOException wrapped = new UncheckedIOException(io);
        assertThatThrownBy(() -> JobThreads.run("testing", 1, 4, null, k -> {
            throw wrapped;
        })).isSameAs(wrapped);
    }
}
