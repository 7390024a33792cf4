/**
 * The file-level steps of a gauge campaign, each one library call that the command line wraps:
 * gauge a problem into a folder of gauged problems and a manifest, un-gauge a folder of raw
 * samples, audit a manifest, score a results table and write its report, analyse the spectrum
 * of the anneal. Long steps say how far
 * they are through {@link org.obverse.campaign.StepProgress}. Uses the core, {@code io} and
 * {@code report}; knows no console.
 */
package org.obverse.campaign;
