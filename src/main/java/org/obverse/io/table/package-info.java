/**
 * The CSV tables: results (one row per read count), campaign jobs and ground energies, device-frame
 * magnetisation and coupler correlations, the score tables, energy-scales tables, the spectrum's
 * levels, gap and chain-scan tables, the decode step's chain breaks and the report's pause-gap
 * table.
 *
 * <p>{@link org.obverse.io.table.CsvReader} is the one strict CSV reader (RFC 4180 quoting, named
 * columns, the place of every refusal); each table class owns its columns and its writer.
 */
package org.obverse.io.table;
