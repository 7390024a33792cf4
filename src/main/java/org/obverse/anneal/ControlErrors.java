package org.obverse.anneal;

import org.apache.commons.rng.UniformRandomProvider;
import org.obverse.model.IsingProblem;
import org.obverse.model.VariableIndex;
import org.obverse.random.RandomStreams;
import org.obverse.random.StandardNormal;
import org.obverse.random.StreamPurpose;

/**
 * The control-error model of a simulated analog device. Static errors: every qubit q has a
 * field offset δh_q ~ N(0, fieldSigma²) and every coupler (a, b) an offset
 * δJ_ab ~ N(0, couplingSigma²), fixed for the device: a pure function of the device seed and
 * the ids, as if drawn once over the whole device (Perdomo-Ortiz et al., Sci. Rep. 6, 18628,
 * 2016, on persistent per-qubit biases). Per-read noise: each read may add fresh
 * N(0, readFieldSigma²) and N(0, readCouplingSigma²) to every field and coupler, drawn from
 * that read's own generator.
 *
 * <p>Errors act on the problem as submitted, in the device frame: a gauged problem
 * h' = g ∘ h runs as h' + δh, which is h + g ∘ δh in the logical frame, so two gauges of the
 * same logical problem meet different effective errors. Only the terms the problem has get an
 * offset: every listed qubit's field (zero or not) and every coupler the problem uses; a
 * coupler the problem does not use stays off. Immutable.
 */
public final class ControlErrors {
    /** No errors at all. */
    public static final ControlErrors NONE = new ControlErrors(0L, 0.0, 0.0, 0.0, 0.0);

    private final long deviceSeed;
    private final double fieldSigma;
    private final double couplingSigma;
    private final double readFieldSigma;
    private final double readCouplingSigma;

    private ControlErrors(long deviceSeed, double fieldSigma, double couplingSigma, double readFieldSigma,
                          double readCouplingSigma) {
        this.deviceSeed = deviceSeed;
        this.fieldSigma = fieldSigma;
        this.couplingSigma = couplingSigma;
        this.readFieldSigma = readFieldSigma;
        this.readCouplingSigma = readCouplingSigma;
    }

    /** Static errors only. */
    public static ControlErrors of(long deviceSeed, double fieldSigma, double couplingSigma) {
        return of(deviceSeed, fieldSigma, couplingSigma, 0.0, 0.0);
    }

    /**
     * Static errors and per-read noise; every width a finite number ≥ 0 in problem units.
     *
     * @throws IllegalArgumentException naming the width that is negative or not finite
     */
    public static ControlErrors of(long deviceSeed, double fieldSigma, double couplingSigma, double readFieldSigma,
                                   double readCouplingSigma) {
        check("field_sigma", fieldSigma);
        check("coupling_sigma", couplingSigma);
        check("read_field_sigma", readFieldSigma);
        check("read_coupling_sigma", readCouplingSigma);
        return new ControlErrors(deviceSeed, fieldSigma, couplingSigma, readFieldSigma, readCouplingSigma);
    }

    private static void check(String name, double v) {
        if (!(v >= 0.0) || !Double.isFinite(v)) {
            throw new IllegalArgumentException(name + " = " + v + " must be a finite number >= 0");
        }
    }

    public long deviceSeed() {
        return deviceSeed;
    }

    public double fieldSigma() {
        return fieldSigma;
    }

    public double couplingSigma() {
        return couplingSigma;
    }

    public double readFieldSigma() {
        return readFieldSigma;
    }

    public double readCouplingSigma() {
        return readCouplingSigma;
    }

    /** Whether there is no error of any kind. */
    public boolean isNone() {
        return fieldSigma == 0.0 && couplingSigma == 0.0 && readFieldSigma == 0.0 && readCouplingSigma == 0.0;
    }

    /** Whether reads add their own noise. */
    public boolean hasReadNoise() {
        return readFieldSigma != 0.0 || readCouplingSigma != 0.0;
    }

    /** The static field offset of a qubit id on this device. */
    public double fieldOffset(int qubit) {
        if (fieldSigma == 0.0) {
            return 0.0;
        }
        return fieldSigma * StandardNormal.draw(RandomStreams.generator(deviceSeed, StreamPurpose.FIELD_OFFSETS, qubit));
    }

    /** The static offset of the coupler between two qubit ids (either order) on this device. */
    public double couplerOffset(int a, int b) {
        if (couplingSigma == 0.0) {
            return 0.0;
        }
        long key = ((long) Math.min(a, b) << 32) | (Math.max(a, b) & 0xffffffffL);
        return couplingSigma * StandardNormal.draw(RandomStreams.generator(deviceSeed, StreamPurpose.COUPLER_OFFSETS, key));
    }

    /** The problem as the device runs it: every field and used coupler plus its static offset. */
    public IsingProblem applyStatic(IsingProblem submitted) {
        if (fieldSigma == 0.0 && couplingSigma == 0.0) {
            return submitted;
        }
        VariableIndex ids = submitted.variables();
        double[] h = submitted.fields();
        for (int k = 0; k < h.length; k++) {
            h[k] += fieldOffset(ids.id(k));
        }
        int[] u = submitted.edgeUs();
        int[] v = submitted.edgeVs();
        double[] j = submitted.couplings();
        for (int e = 0; e < j.length; e++) {
            j[e] += couplerOffset(ids.id(u[e]), ids.id(v[e]));
        }
        return IsingProblem.of(ids, h, u, v, j, submitted.offset());
    }

    /**
     * Adds one read's noise in place: fields by position, couplings by coupler number. Output:
     * fields and couplings are modified. Draws from the given generator, fields first.
     */
    void addReadNoise(UniformRandomProvider rng, double[] fields, double[] couplings) {
        if (readFieldSigma != 0.0) {
            for (int k = 0; k < fields.length; k++) {
                fields[k] += readFieldSigma * StandardNormal.draw(rng);
            }
        }
        if (readCouplingSigma != 0.0) {
            for (int e = 0; e < couplings.length; e++) {
                couplings[e] += readCouplingSigma * StandardNormal.draw(rng);
            }
        }
    }

    @Override
    public String toString() {
        return "ControlErrors[seed " + deviceSeed + ", field " + fieldSigma + ", coupling " + couplingSigma
                + ", read field " + readFieldSigma + ", read coupling " + readCouplingSigma + "]";
    }
}
