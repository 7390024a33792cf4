/**
 * Scoring a campaign: success probability with binomial intervals, time to solution,
 * quantiles (Hyndman and Fan type 7, with a stated rule for infinite values), a seeded
 * hierarchical bootstrap, setting comparisons with a sign test, and gauge and bias
 * diagnostics. Pure mathematics over primitive arrays and small value types: it knows no
 * files, no console and no other obverse package.
 */
package org.obverse.stats;
