/**
 * Immutable sparse spin (Ising) and binary (QUBO) problems on sparse integer ids, and the exact
 * conversion between them. Knows no files and no console.
 */
package org.obverse.model;
