package org.obverse.io;

import java.io.Closeable;
import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * An output file being written under a temporary name beside its target, for writers that
 * stream (and may seek back to fix a header), which {@link AtomicOutput#writeFile} with its
 * single callback cannot serve. Same rules: an existing target is refused unless forced; only
 * {@link #commit()} renames the finished file into place; {@link #close()} without commit
 * deletes the temporary file, so nothing is ever half-written.
 */
final class PendingFile implements Closeable {
    private final Path target;
    private final Path temp;
    private final FileChannel channel;
    private boolean done;

    private PendingFile(Path target, Path temp, FileChannel channel) {
        this.target = target;
        this.temp = temp;
        this.channel = channel;
    }

    static PendingFile create(Path target, boolean force) throws IOException {
        AtomicOutput.checkTarget(target, force);
        Path abs = target.toAbsolutePath();
        Path parent = abs.getParent();
        Files.createDirectories(parent);
        Path tmp = Files.createTempFile(parent, "." + abs.getFileName() + ".", ".part");
        try {
            return new PendingFile(abs, tmp, FileChannel.open(tmp, StandardOpenOption.WRITE));
        } catch (IOException | RuntimeException e) {
            Files.deleteIfExists(tmp);
            throw e;
        }
    }

    FileChannel channel() {
        return channel;
    }

    Path target() {
        return target;
    }

    /** Closes the temporary file and renames it onto the target. */
    void commit() throws IOException {
        if (done) {
            throw new IllegalStateException(target + " is already committed or discarded");
        }
        done = true;
        channel.close();
        try {
            AtomicOutput.publish(temp, target);
        } finally {
            Files.deleteIfExists(temp);
        }
    }

    boolean committed() {
        return done;
    }

    /** Discards the temporary file unless committed. */
    @Override
    public void close() throws IOException {
        if (!done) {
            done = true;
            try {
                channel.close();
            } finally {
                Files.deleteIfExists(temp);
            }
        }
    }
}
