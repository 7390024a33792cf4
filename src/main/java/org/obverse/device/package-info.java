/**
 * A device's working graph and limits (field, coupling, per-coupler and per-qubit coupling-sum
 * ranges), and a compliance check that lists every violation. Knows no files.
 */
package org.obverse.device;
