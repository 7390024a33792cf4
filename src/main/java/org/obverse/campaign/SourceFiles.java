package org.obverse.campaign;

import java.nio.file.Files;
import java.nio.file.Path;
import org.obverse.io.BadInputException;
import org.obverse.io.codec.ChainList;
import org.obverse.io.codec.ChainsCodec;
import org.obverse.io.codec.DeviceCodec;
import org.obverse.io.codec.GaugeManifest;
import org.obverse.io.codec.ManifestCodec;
import org.obverse.io.codec.ProblemCodec;
import org.obverse.io.codec.ProblemFile;
import org.obverse.io.samples.SampleFormat;
import org.obverse.device.DeviceLimits;

/**
 * A manifest together with the source files it names, read and checked against the recorded
 * hashes. Paths in a manifest are relative to its folder.
 */
final class SourceFiles {
    final Path manifestFile;
    final Path folder;
    final GaugeManifest manifest;

    SourceFiles(Path manifestFile) {
        this.manifestFile = manifestFile;
        this.manifest = ManifestCodec.read(manifestFile);
        Path parent = manifestFile.toAbsolutePath().getParent();
        this.folder = parent;
    }

    Path resolve(GaugeManifest.SourceFile s) {
        return folder.resolve(s.path()).normalize();
    }

    ProblemFile problem() {
        return ProblemCodec.read(resolve(manifest.problem()));
    }

    DeviceLimits device() {
        return DeviceCodec.read(resolve(manifest.device()));
    }

    ChainList chains() {
        return manifest.chains() == null ? null : ChainsCodec.read(resolve(manifest.chains()));
    }

    /** Refuses a source whose content changed since the gauges were made. */
    static void requireHash(Path file, String actual, String recorded, String what) {
        if (!actual.equals(recorded)) {
            throw BadInputException.at(file, "", "the " + what + " changed since the gauges were made (content hash "
                    + actual.substring(0, 12) + "…, the manifest records " + recorded.substring(0, 12) + "…)",
                    "restore the original file or draw the gauges again");
        }
    }

    /**
     * The samples file of a gauge in a folder, {@code <stem>.npy} or {@code <stem>.csv}, or null
     * where there is neither.
     *
     * @throws BadInputException where both exist (which to read would be a guess)
     */
    static Path gaugeSamples(Path folder, GaugeManifest.Entry e) {
        Path npy = folder.resolve(SampleFormat.NPY.fileName(e.stem()));
        Path csv = folder.resolve(SampleFormat.CSV.fileName(e.stem()));
        boolean hasNpy = Files.exists(npy);
        boolean hasCsv = Files.exists(csv);
        if (hasNpy && hasCsv) {
            throw BadInputException.at(folder, e.stem(), "both " + npy.getFileName() + " and "
                    + csv.getFileName() + " exist", "keep one samples file per gauge");
        }
        return hasNpy ? npy : hasCsv ? csv : null;
    }

    /** "g0003.npy or g0003.csv": the names a gauge's samples file may have. */
    static String gaugeSampleNames(GaugeManifest.Entry e) {
        return SampleFormat.NPY.fileName(e.stem()) + " or " + SampleFormat.CSV.fileName(e.stem());
    }
}
