package org.obverse.embed;

import org.obverse.model.IsingProblem;

/**
 * A logical problem placed on a device: the physical problem and what is needed to read its
 * energies back in logical units. For a sample in which no chain is broken,
 * E_phys = scale · E_logical + chainEnergy, where chainEnergy = Σ over chain couplers of their
 * coupling (with one chain coupling V everywhere: chainCouplerCount · V). The physical offset
 * is scale · the logical offset, which is what makes the identity hold with the offset in.
 * Immutable.
 */
public final class EmbeddedProblem {
    private final IsingProblem physical;
    private final Chains chains;
    private final double scale;
    private final ChainStrength strength;
    private final double[] chainCouplings;
    private final int[] chainCouplersPerChain;
    private final int chainCouplerCount;
    private final double chainEnergy;

    EmbeddedProblem(IsingProblem physical, Chains chains, double scale, ChainStrength strength,
                    double[] chainCouplings, int[] chainCouplersPerChain) {
        this.physical = physical;
        this.chains = chains;
        this.scale = scale;
        this.strength = strength;
        this.chainCouplings = chainCouplings;
        this.chainCouplersPerChain = chainCouplersPerChain;
        int count = 0;
        double energy = 0.0;
        for (int c = 0; c < chainCouplings.length; c++) {
            count += chainCouplersPerChain[c];
            energy += chainCouplersPerChain[c] * chainCouplings[c];
        }
        this.chainCouplerCount = count;
        // With one coupling everywhere, count · V in one product: what a reader of the meta computes.
        this.chainEnergy = strength.mode() == ChainStrength.Mode.UNIFORM ? count * strength.value() : energy;
    }

    /** The physical problem, on qubit ids. */
    public IsingProblem physical() {
        return physical;
    }

    /** The chains used, restricted to the logical problem's variables. */
    public Chains chains() {
        return chains;
    }

    /** The factor the logical terms (and offset) were multiplied by. */
    public double scale() {
        return scale;
    }

    /** The chain coupling asked for. */
    public ChainStrength strength() {
        return strength;
    }

    /** The coupling inside chain c, in physical units. */
    public double chainCoupling(int c) {
        return chainCouplings[c];
    }

    /** Number of working couplers inside chain c. */
    public int chainCouplers(int c) {
        return chainCouplersPerChain[c];
    }

    /** Number of couplers inside chains, all chains together. */
    public int chainCouplerCount() {
        return chainCouplerCount;
    }

    /** Σ over chain couplers of their coupling: the physical energy of the chains when none is broken. */
    public double chainEnergy() {
        return chainEnergy;
    }

    /** The logical energy of an unbroken sample from its physical energy: (E_phys − chainEnergy) / scale. */
    public double logicalEnergy(double physicalEnergy) {
        return (physicalEnergy - chainEnergy) / scale;
    }
}
