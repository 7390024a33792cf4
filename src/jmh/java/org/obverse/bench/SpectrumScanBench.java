package org.obverse.bench;

import java.util.concurrent.TimeUnit;
import org.obverse.spectrum.AnnealSpectrum;
import org.obverse.spectrum.GapScan;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * A whole coarse scan: the four lowest levels at 100 values of s for a 16-spin problem with
 * fields (2^16 states), Lanczos solver, default tolerance 1e-10. Single-shot: one op is one
 * scan. The baseline in the same run is one Lanczos solve at s = 0.5 (a hundredth of the scan
 * would be that if every s cost the same).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 1)
@Measurement(iterations = 2)
public class SpectrumScanBench {
    private AnnealSpectrum spectrum;
    private double[] grid;

    @Setup
    public void setup() {
        spectrum = SpectrumBench.sixteenSpins();
        grid = SpectrumBench.hundredPoints();
    }

    @Benchmark
    public GapScan scanHundredPoints() {
        return spectrum.scan(grid);
    }

    @Benchmark
    public double[] oneSolve() {
        return spectrum.levels(0.5);
    }
}
