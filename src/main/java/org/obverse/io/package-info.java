/**
 * Files in and out: the base of the I/O layer.
 *
 * <p>This package holds what every format shares: {@link org.obverse.io.BadInputException} (the
 * one-line refusal that the command line turns into exit code 2), {@link org.obverse.io.Messages}
 * (how a place in a file is named), and the guarded readers {@link org.obverse.io.InputFiles} and
 * {@link org.obverse.io.TextInput}. Each file format is owned by exactly one class in a
 * sub-package:
 * <ul>
 *   <li>{@code io.output}: atomic publication of outputs (temporary name, then rename; locks,
 *       markers, refusal to overwrite or to write inside an input);</li>
 *   <li>{@code io.npy}: the NPY container (header, dtypes, streaming reader and writer,
 *       one-dimensional vectors);</li>
 *   <li>{@code io.samples}: sample files, NPY or CSV, ±1 or 0/1, packed into bit-sliced blocks;</li>
 *   <li>{@code io.json}: strict JSON reading and the canonical content hash;</li>
 *   <li>{@code io.codec}: the documents: problems (JSON, NPY, NPZ), devices, chains, control
 *       errors, gauge manifests, schedules, campaign plans;</li>
 *   <li>{@code io.table}: the CSV tables: results, jobs, magnetisation and correlations,
 *       scores.</li>
 * </ul>
 * Sub-packages depend on this package and on lower sub-packages (output &lt; npy &lt; samples;
 * json &lt; codec; table &lt; codec), never the other way round.
 */
package org.obverse.io;
