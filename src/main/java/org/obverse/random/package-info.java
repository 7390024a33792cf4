/**
 * The one home of randomness: seeded generators that give the same numbers on every machine
 * and thread count, and the draws built on them. The lowest package: it imports nothing of
 * the project, and every other package may use it.
 *
 * <p>{@link org.obverse.random.RandomStreams} holds the mixing function (the SplitMix64
 * finaliser) and {@code derive(seed, purpose, index)}, the way new code gets a seed or a
 * generator for a numbered item; {@link org.obverse.random.StreamPurpose} lists every purpose
 * number in use. {@link org.obverse.random.LegacyStreams} keeps, under names, the older
 * recipes whose numbers recorded files and golden vectors pin; they are built on the same
 * mixing function and are not for new code. {@link org.obverse.random.StandardNormal} draws
 * Gaussian deviates. Every generator is Commons RNG's {@code XO_RO_SHI_RO_128_PP} with its
 * native seed spelled out here, so no library seed conversion is involved.
 */
package org.obverse.random;
