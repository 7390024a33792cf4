package org.obverse.io.codec;

/**
 * The embedding block of a physical problem's {@code meta} ({@code obverse.problem/1}): how
 * the logical problem was embedded, so energies can be related back to it. Written and read by
 * {@link ProblemCodec} under the keys {@code scale}, {@code chain_coupling},
 * {@code chain_coupling_mode}, {@code chain_couplers}, {@code chain_energy},
 * {@code logical_offset}, {@code logical_variables}, {@code longest_chain}.
 *
 * @param scale             factor of the logical terms
 * @param chainCoupling     the chain coupling value
 * @param chainCouplingMode how the chain coupling was chosen (its label)
 * @param chainCouplers     number of couplers inside chains
 * @param chainEnergy       energy of the chain couplers with every chain intact
 * @param logicalOffset     the logical problem's offset
 * @param logicalVariables  the logical problem's variable count
 * @param longestChain      qubits in the longest chain
 */
public record EmbeddingMeta(double scale, double chainCoupling, String chainCouplingMode, int chainCouplers,
                            double chainEnergy, double logicalOffset, int logicalVariables, int longestChain) {
}
