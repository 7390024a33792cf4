package org.obverse.device;

import java.util.Collections;
import java.util.HashMap;
import java.util.Map;
import java.util.Optional;

/**
 * What a device accepts: a field range, a coupling range (often asymmetric, such as
 * [-2, +1]), optional ranges for single couplers that override the coupling range, an optional
 * range for the sum of the couplings at each qubit, and an optional working graph. Immutable.
 */
public final class DeviceLimits {
    private final ValueRange field;
    private final ValueRange coupling;
    private final ValueRange couplingSum;
    private final Map<Long, ValueRange> couplerRanges;
    private final QubitGraph graph;

    private DeviceLimits(Builder b) {
        this.field = b.field;
        this.coupling = b.coupling;
        this.couplingSum = b.couplingSum;
        this.couplerRanges = Collections.unmodifiableMap(new HashMap<>(b.couplerRanges));
        this.graph = b.graph;
    }

    /** Limits with only a field and a coupling range. */
    public static DeviceLimits of(ValueRange field, ValueRange coupling) {
        return builder(field, coupling).build();
    }

    public static Builder builder(ValueRange field, ValueRange coupling) {
        return new Builder(field, coupling);
    }

    public ValueRange fieldRange() {
        return field;
    }

    /** The default coupling range. */
    public ValueRange couplingRange() {
        return coupling;
    }

    /** The range of the coupler between qubits a and b: its own where one is given, else the default. */
    public ValueRange couplingRange(int a, int b) {
        ValueRange r = couplerRanges.get(QubitGraph.key(a, b));
        return r != null ? r : coupling;
    }

    public Optional<ValueRange> couplingSumRange() {
        return Optional.ofNullable(couplingSum);
    }

    public Optional<QubitGraph> graph() {
        return Optional.ofNullable(graph);
    }

    /** Per-coupler ranges keyed by {@link QubitGraph#key(int, int)}. */
    public Map<Long, ValueRange> couplerRanges() {
        return couplerRanges;
    }

    /** A builder seeded with these limits. */
    public Builder toBuilder() {
        Builder b = new Builder(field, coupling);
        b.couplingSum = couplingSum;
        b.couplerRanges.putAll(couplerRanges);
        b.graph = graph;
        return b;
    }

    /** Builds {@link DeviceLimits}. */
    public static final class Builder {
        private final ValueRange field;
        private final ValueRange coupling;
        private ValueRange couplingSum;
        private final Map<Long, ValueRange> couplerRanges = new HashMap<>();
        private QubitGraph graph;

        private Builder(ValueRange field, ValueRange coupling) {
            this.field = field;
            this.coupling = coupling;
        }

        public Builder couplingSum(ValueRange range) {
            this.couplingSum = range;
            return this;
        }

        public Builder couplerRange(int a, int b, ValueRange range) {
            if (a == b) {
                throw new IllegalArgumentException("coupler range (" + a + ", " + b + ") joins a qubit to itself");
            }
            if (couplerRanges.putIfAbsent(QubitGraph.key(a, b), range) != null) {
                throw new IllegalArgumentException("coupler range (" + a + ", " + b + ") is given twice");
            }
            return this;
        }

        public Builder graph(QubitGraph g) {
            this.graph = g;
            return this;
        }

        public DeviceLimits build() {
            return new DeviceLimits(this);
        }
    }
}
