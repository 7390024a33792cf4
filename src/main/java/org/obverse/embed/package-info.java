/**
 * Chains and embedding: the {@link org.obverse.embed.Chains} value type, the independent
 * validity check ({@link org.obverse.embed.EmbeddingCheck}), finders (the native clique
 * {@link org.obverse.embed.CliqueEmbedding} and the rip-up-and-reroute
 * {@link org.obverse.embed.RerouteEmbeddingFinder}), placing a logical problem on a device
 * ({@link org.obverse.embed.ChainEmbedder}) and reading physical samples back as logical ones
 * ({@link org.obverse.embed.ChainDecoder}). Knows no files and no console; spec/chains.md
 * states the rules.
 */
package org.obverse.embed;
