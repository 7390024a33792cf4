/**
 * The CSV tables: results (one row per read count), campaign jobs, device-frame magnetisation and
 * coupler correlations, and the score tables.
 *
 * <p>{@link org.obverse.io.table.CsvReader} is the one strict CSV reader (RFC 4180 quoting, named
 * columns, the place of every refusal); each table class owns its columns and its writer.
 */
package org.obverse.io.table;
