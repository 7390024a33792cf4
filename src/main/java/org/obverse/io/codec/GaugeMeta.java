package org.obverse.io.codec;

/**
 * The {@code gauge} block of a gauged problem's {@code meta} ({@code obverse.problem/1}): which
 * gauge of a manifest made it from which source problem. Written and read by {@link ProblemCodec}
 * under {@code meta.gauge} with the keys {@code index}, {@code source_sha256}, {@code flipped_count}.
 *
 * @param index        the gauge's index in its manifest
 * @param sourceSha256 content hash of the source problem ({@link ProblemCodec#contentHash})
 * @param flippedCount spins the gauge flips
 */
public record GaugeMeta(int index, String sourceSha256, int flippedCount) {
}
