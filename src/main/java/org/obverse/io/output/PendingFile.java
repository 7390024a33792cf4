package org.obverse.io.output;

import org.obverse.io.BadInputException;
import java.io.Closeable;
import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.List;

/**
 * An output file being written under a temporary name, for writers that stream (and may seek
 * back to fix a header), which {@link AtomicOutput#writeFile} with its single callback cannot
 * serve. Inside a folder that {@link AtomicOutput} is filling, the file goes to a temporary
 * name beside its target; anywhere else it goes through {@link AtomicOutput}'s full protocol
 * (lock, owned temporary folder, publication). Same rules: an existing target is refused
 * unless forced; only {@link #commit()} renames the finished file into place; {@link #close()}
 * without commit deletes the temporary file, so nothing is ever half-written.
 */
public final class PendingFile implements Closeable {
    private final Path target;
    private final Path temp;
    private final FileChannel channel;
    // The full protocol, where the target is not inside a folder being filled; else null.
    private final AtomicOutput.Publication publication;
    private boolean done;

    private PendingFile(Path target, Path temp, FileChannel channel, AtomicOutput.Publication publication) {
        this.target = target;
        this.temp = temp;
        this.channel = channel;
        this.publication = publication;
    }

    public static PendingFile create(Path target, boolean force) throws IOException {
        Path abs = target.toAbsolutePath().normalize();
        if (AtomicOutput.isPrivate(abs)) {
            if (!force && Files.exists(abs, LinkOption.NOFOLLOW_LINKS)) {
                throw BadInputException.at(target, "", "already exists", "choose another output or pass --force to replace it");
            }
            Path tmp = TemporaryNames.file(abs.getParent(), "." + abs.getFileName() + ".", ".part");
            try {
                return new PendingFile(abs, tmp, FileChannel.open(tmp, StandardOpenOption.WRITE), null);
            } catch (IOException | RuntimeException e) {
                Files.deleteIfExists(tmp);
                throw e;
            }
        }
        AtomicOutput.Publication p = AtomicOutput.Publication.begin(abs, force, List.of());
        try {
            Path tmp = p.payload();
            return new PendingFile(abs, tmp, FileChannel.open(tmp, StandardOpenOption.CREATE_NEW,
                    StandardOpenOption.WRITE), p);
        } catch (IOException | RuntimeException e) {
            p.close();
            throw e;
        }
    }

    public FileChannel channel() {
        return channel;
    }

    public Path target() {
        return target;
    }

    /** Closes the temporary file and renames it onto the target. */
    public void commit() throws IOException {
        if (done) {
            throw new IllegalStateException(target + " is already committed or discarded");
        }
        done = true;
        channel.close();
        if (publication != null) {
            try {
                publication.publish();
            } finally {
                publication.close();
            }
            return;
        }
        try {
            AtomicOutput.publish(temp, target);
        } finally {
            Files.deleteIfExists(temp);
        }
    }

    public boolean committed() {
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
                if (publication != null) {
                    publication.close();
                } else {
                    Files.deleteIfExists(temp);
                }
            }
        }
    }
}
