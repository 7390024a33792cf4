package org.obverse.bench;

import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import org.openjdk.jmh.annotations.AuxCounters;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;

/**
 * Attempts made and thread CPU time used, summed over an iteration (secondary results of the
 * sampler benches, so they can report attempts per CPU-ns on a shared machine).
 */
@State(Scope.Thread)
@AuxCounters(AuxCounters.Type.EVENTS)
public class CpuCounters {
    private static final ThreadMXBean BEAN = ManagementFactory.getThreadMXBean();
    public long attempts;
    public long cpuNanos;

    @Setup(Level.Iteration)
    public void clear() {
        attempts = 0;
        cpuNanos = 0;
    }

    long now() {
        return BEAN.getCurrentThreadCpuTime();
    }
}
