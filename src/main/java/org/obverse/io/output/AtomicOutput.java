package org.obverse.io.output;

import org.obverse.io.BadInputException;
import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.channels.FileLock;
import java.nio.channels.OverlappingFileLockException;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.DirectoryStream;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.nio.file.attribute.FileTime;
import java.util.ArrayList;
import java.util.Collection;
import java.util.Comparator;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import java.util.stream.Stream;

/**
 * The one way obverse writes an output, file or folder, so that a person can trust it:
 * <ul>
 * <li>an output that is, contains or lies inside one of the run's inputs is refused (real
 *     paths are compared, so links do not hide it);</li>
 * <li>the target is locked while it is written (a lock file {@code .NAME.obverse-lock} beside
 *     it, held with {@link FileChannel#tryLock}); a second run that wants the same target is
 *     refused at once with one line rather than made to wait, since it would only find the
 *     output there afterwards;</li>
 * <li>the output is written under a temporary folder {@code .NAME.obverse-tmp-*} beside the
 *     target, holding an {@code owner} marker (process id and start time), and renamed into
 *     place only when complete; an output that appeared meanwhile is refused unless forced;</li>
 * <li>several files of one run ({@link #writeFiles}) are published together, after all are
 *     written;</li>
 * <li>with force, an existing folder is renamed aside into the temporary folder, the new one
 *     renamed in, then the old one deleted: a kill between the steps leaves the old output in
 *     the temporary folder, and the next run that writes that target puts it back;</li>
 * <li>the temporary folder is removed on success, on failure, on SIGTERM or Ctrl-C (a shutdown
 *     hook), and after a {@code kill -9} by the next run writing beside it: a temporary folder
 *     whose owner process is gone is stale.</li>
 * </ul>
 */
public final class AtomicOutput {
    private static final String TMP_TAG = ".obverse-tmp-";
    private static final String LOCK_TAG = ".obverse-lock";
    private static final String OWNER = "owner";
    private static final String NEW = "new";
    private static final String OLD = "old";
    // A temporary folder without an owner marker may be one being created right now.
    private static final long UNMARKED_GRACE_MILLIS = 60_000;

    private static final Set<Publication> ACTIVE = new LinkedHashSet<>();
    private static boolean hookInstalled;

    private AtomicOutput() {
    }

    /** Writes one file. */
    @FunctionalInterface
    public interface Writer {
        void write(OutputStream out) throws IOException;
    }

    /** Fills a directory. */
    @FunctionalInterface
    public interface DirectoryFiller {
        void fill(Path dir) throws IOException;
    }

    /** Writes several files, given their temporary paths (same names as the targets, in order). */
    @FunctionalInterface
    public interface FilesFiller {
        void fill(List<Path> files) throws IOException;
    }

    /** The inputs of a run, nulls (options not given) left out. */
    public static List<Path> inputs(Path... paths) {
        List<Path> l = new ArrayList<>();
        for (Path p : paths) {
            if (p != null) {
                l.add(p);
            }
        }
        return l;
    }

    /**
     * Refuses early, before any work: an output that overlaps an input, or that exists while
     * force is false. The same checks run again, under the lock, when the output is written.
     */
    public static void checkTarget(Path target, boolean force, Collection<Path> inputs) {
        refuseOverlap(target, inputs);
        if (!force && Files.exists(target, LinkOption.NOFOLLOW_LINKS)) {
            throw exists(target);
        }
    }

    /** Writes a file. */
    public static void writeFile(Path target, boolean force, Collection<Path> inputs, Writer writer) throws IOException {
        writeFiles(List.of(target), force, inputs, files -> {
            try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(files.get(0),
                    StandardOpenOption.CREATE_NEW, StandardOpenOption.WRITE), 1 << 16)) {
                writer.write(out);
            }
        });
    }

    /** Writes a UTF-8 text file. */
    public static void writeText(Path target, boolean force, Collection<Path> inputs, String text) throws IOException {
        writeFile(target, force, inputs, out -> out.write(text.getBytes(StandardCharsets.UTF_8)));
    }

    /** Fills a fresh folder under a temporary name and publishes it as target. */
    public static void writeDirectory(Path target, boolean force, Collection<Path> inputs, DirectoryFiller filler)
            throws IOException {
        try (Publication p = Publication.begin(target, force, inputs)) {
            Files.createDirectory(p.payload());
            try {
                filler.fill(p.payload());
            } catch (IOException e) {
                throw naming(e, target);
            }
            p.publish();
        }
    }

    /**
     * Writes several files as one unit: each is written under its own temporary folder, and only
     * when all are complete are they renamed into place, after checking again that none exists.
     */
    public static void writeFiles(List<Path> targets, boolean force, Collection<Path> inputs, FilesFiller filler)
            throws IOException {
        List<Publication> ps = new ArrayList<>();
        try {
            Set<Path> seen = new LinkedHashSet<>();
            for (Path t : targets) {
                if (!seen.add(t.toAbsolutePath().normalize())) {
                    throw new IllegalArgumentException("output " + t + " is named twice");
                }
                ps.add(Publication.begin(t, force, inputs));
            }
            List<Path> temps = new ArrayList<>();
            for (Publication p : ps) {
                temps.add(p.payload());
            }
            try {
                filler.fill(temps);
            } catch (IOException e) {
                throw naming(e, targets.size() == 1 ? targets.get(0) : targets.get(0).toAbsolutePath().getParent());
            }
            for (Publication p : ps) {
                p.checkPublishable();
            }
            for (Publication p : ps) {
                p.publish();
            }
        } finally {
            IOException first = null;
            for (Publication p : ps) {
                try {
                    p.close();
                } catch (IOException e) {
                    first = first == null ? e : first;
                }
            }
            if (first != null) {
                throw first;
            }
        }
    }

    /**
     * Whether a path lies inside a temporary folder that this process is filling: a file
     * written there needs no lock or marker of its own, the folder is published as one.
     */
    static boolean isPrivate(Path target) {
        Path abs = target.toAbsolutePath().normalize();
        synchronized (ACTIVE) {
            for (Publication p : ACTIVE) {
                if (abs.startsWith(p.tmp)) {
                    return true;
                }
            }
        }
        return false;
    }

    /**
     * An I/O failure that says which output it hit: a failure without a file name (a full
     * disk reported by a stream) gets the output's name.
     */
    static IOException naming(IOException e, Path output) {
        if (e instanceof java.nio.file.FileSystemException && ((java.nio.file.FileSystemException) e).getFile() != null) {
            return e;
        }
        String m = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
        return new IOException("writing " + output + ": " + m, e);
    }

    private static BadInputException exists(Path target) {
        return BadInputException.at(target, "", "already exists", "choose another output or pass --force to replace it");
    }

    // ---------------------------------------------------------------------------------------
    // Inputs

    /**
     * Refuses a target that is an input, holds an input (a folder above it) or lies inside an
     * input folder, comparing real paths (links resolved; a target that does not exist yet is
     * resolved through its nearest existing parent).
     */
    static void refuseOverlap(Path target, Collection<Path> inputs) {
        if (inputs == null || inputs.isEmpty()) {
            return;
        }
        Path t = realish(target);
        for (Path in : inputs) {
            if (in == null || !Files.exists(in)) {
                continue;
            }
            Path i = realish(in);
            String why = null;
            if (t.equals(i)) {
                why = "is the input " + in;
            } else if (i.startsWith(t)) {
                why = "holds the input " + in;
            } else if (t.startsWith(i)) {
                why = "lies inside the input folder " + in;
            }
            if (why != null) {
                throw BadInputException.at(target, "", "the output " + why,
                        "write the output elsewhere; an input is never replaced or changed");
            }
        }
    }

    /** The real path of p, or of its nearest existing ancestor joined with the rest. */
    static Path realish(Path p) {
        Path abs = p.toAbsolutePath().normalize();
        Path rest = abs.getRoot().relativize(abs);
        Path existing = abs;
        while (existing != null) {
            try {
                Path real = existing.toRealPath();
                return real.resolve(existing.relativize(abs)).normalize();
            } catch (IOException e) {
                existing = existing.getParent();
            }
        }
        return abs.getRoot().resolve(rest);
    }

    // ---------------------------------------------------------------------------------------
    // One output being written

    /** One target: its lock, its temporary folder, its publication. */
    static final class Publication implements AutoCloseable {
        private enum State { WRITING, ASIDE, PUBLISHED, CLOSED }

        final Path target;
        final Path tmp;
        private final boolean force;
        private final Path lockFile;
        private final FileChannel lockChannel;
        private final FileLock lock;
        private State state = State.WRITING;

        private Publication(Path target, Path tmp, boolean force, Path lockFile, FileChannel lockChannel, FileLock lock) {
            this.target = target;
            this.tmp = tmp;
            this.force = force;
            this.lockFile = lockFile;
            this.lockChannel = lockChannel;
            this.lock = lock;
        }

        /** Locks the target, cleans stale temporary folders, checks it, makes the temporary folder. */
        static Publication begin(Path target, boolean force, Collection<Path> inputs) throws IOException {
            Path abs = target.toAbsolutePath().normalize();
            if (abs.getFileName() == null) {
                throw BadInputException.at(target, "", "is not a file or folder name", "give an output path");
            }
            refuseOverlap(abs, inputs);
            Path parent = abs.getParent();
            try {
                Files.createDirectories(parent);
            } catch (FileAlreadyExistsException e) {
                throw BadInputException.at(parent, "", "is a file, not a folder", "choose another output");
            }
            String name = abs.getFileName().toString();
            Path lockFile = parent.resolve("." + name + LOCK_TAG);
            FileChannel ch = null;
            FileLock lock = null;
            try {
                for (int attempt = 0; attempt < 5 && lock == null; attempt++) {
                    ch = FileChannel.open(lockFile, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                            StandardOpenOption.READ, LinkOption.NOFOLLOW_LINKS);
                    try {
                        lock = ch.tryLock();
                    } catch (OverlappingFileLockException e) {
                        lock = null;
                    }
                    if (lock == null) {
                        ch.close();
                        throw BadInputException.at(target, "", "is being written by another obverse run (it holds "
                                + lockFile.getFileName() + ")", "wait for that run to finish, or choose another output");
                    }
                    // The lock file may have been deleted by its last holder after we opened it:
                    // a lock on a deleted file guards nothing. Mark it and read the mark back by name.
                    String token = ProcessHandle.current().pid() + " " + System.nanoTime() + " " + name + "\n";
                    ch.truncate(0);
                    ch.write(ByteBuffer.wrap(token.getBytes(StandardCharsets.UTF_8)), 0);
                    String seen;
                    try {
                        seen = Files.readString(lockFile, StandardCharsets.UTF_8);
                    } catch (IOException e) {
                        seen = "";
                    }
                    if (!seen.equals(token)) {
                        lock.release();
                        ch.close();
                        lock = null;
                        ch = null;
                    }
                }
                if (lock == null) {
                    throw BadInputException.at(target, "", "is being written by another obverse run",
                            "wait for that run to finish, or choose another output");
                }
                cleanStale(parent, name);
                if (!force && Files.exists(abs, LinkOption.NOFOLLOW_LINKS)) {
                    throw exists(target);
                }
                Path tmp = TemporaryNames.folder(parent, "." + name + TMP_TAG);
                // Registered at once, so that SIGTERM or Ctrl-C from here on removes it.
                Publication p = new Publication(abs, tmp, force, lockFile, ch, lock);
                register(p);
                try {
                    // The marker appears whole (written aside, then renamed), so no reader sees half of it.
                    Path part = tmp.resolve(OWNER + ".part");
                    Files.writeString(part, ownerLine() + name + "\n");
                    Files.move(part, tmp.resolve(OWNER), StandardCopyOption.ATOMIC_MOVE);
                    Files.createDirectory(tmp.resolve(NEW));
                } catch (IOException | RuntimeException e) {
                    p.close();
                    throw e;
                }
                return p;
            } catch (IOException | RuntimeException | Error e) {
                if (lock != null) {
                    Files.deleteIfExists(lockFile);
                    lock.release();
                }
                if (ch != null) {
                    ch.close();
                }
                throw e;
            }
        }

        /** Where the output is written: a path named as the target, inside the temporary folder. */
        Path payload() {
            return tmp.resolve(NEW).resolve(target.getFileName().toString());
        }

        /** Refuses, before anything is renamed, a target that appeared while the output was written. */
        void checkPublishable() {
            if (!force && Files.exists(target, LinkOption.NOFOLLOW_LINKS)) {
                throw BadInputException.at(target, "", "appeared while this output was being written",
                        "choose another output or pass --force to replace it");
            }
        }

        /** Renames the finished output into place. */
        synchronized void publish() throws IOException {
            if (state != State.WRITING) {
                throw new IllegalStateException(target + " is already published or closed");
            }
            Path payload = payload();
            ordinaryPermissions(payload, Files.isDirectory(payload, LinkOption.NOFOLLOW_LINKS));
            boolean exists = Files.exists(target, LinkOption.NOFOLLOW_LINKS);
            if (exists && !force) {
                checkPublishable();
            }
            if (!exists) {
                if (Files.isDirectory(payload, LinkOption.NOFOLLOW_LINKS)) {
                    moveNoReplace(payload, target);
                } else {
                    linkOrMove(payload, target);
                }
            } else if (!Files.isDirectory(target, LinkOption.NOFOLLOW_LINKS)
                    && !Files.isDirectory(payload, LinkOption.NOFOLLOW_LINKS)) {
                // A file replacing a file: rename(2) replaces it in one step.
                move(payload, target, true);
            } else {
                Files.createDirectories(tmp.resolve(OLD));
                move(target, tmp.resolve(OLD).resolve(target.getFileName().toString()), false);
                state = State.ASIDE;
                move(payload, target, false);
            }
            state = State.PUBLISHED;
        }

        /** Puts an old output back if it was moved aside and the new one did not arrive; deletes the temporary folder. */
        synchronized void abandon() {
            if (state == State.CLOSED) {
                return;
            }
            try {
                restoreAside(tmp, target);
            } catch (IOException | RuntimeException e) {
                // best effort at exit: keep the old output in the temporary folder for the next run
                return;
            }
            for (int i = 0; i < 5 && Files.exists(tmp, LinkOption.NOFOLLOW_LINKS); i++) {
                try {
                    deleteTree(tmp);
                } catch (IOException | RuntimeException e) {
                    // the writer may still add files; try again
                }
            }
            try {
                Files.deleteIfExists(lockFile); // the lock itself ends with the process
            } catch (IOException e) {
                // a lock file left behind is reused by the next run
            }
        }

        @Override
        public synchronized void close() throws IOException {
            if (state == State.CLOSED) {
                return;
            }
            try {
                restoreAside(tmp, target);
                deleteTree(tmp);
            } finally {
                state = State.CLOSED;
                unregister(this);
                try {
                    Files.deleteIfExists(lockFile);
                } finally {
                    try {
                        lock.release();
                    } finally {
                        lockChannel.close();
                    }
                }
            }
        }
    }

    private static void register(Publication p) {
        synchronized (ACTIVE) {
            if (!hookInstalled) {
                Runtime.getRuntime().addShutdownHook(new Thread(AtomicOutput::abandonAll, "obverse-output-cleanup"));
                hookInstalled = true;
            }
            ACTIVE.add(p);
        }
    }

    private static void unregister(Publication p) {
        synchronized (ACTIVE) {
            ACTIVE.remove(p);
        }
    }

    private static void abandonAll() {
        List<Publication> ps;
        synchronized (ACTIVE) {
            ps = new ArrayList<>(ACTIVE);
        }
        for (Publication p : ps) {
            p.abandon();
        }
    }

    // ---------------------------------------------------------------------------------------
    // Stale temporary folders

    private static String ownerLine() {
        ProcessHandle me = ProcessHandle.current();
        long start = me.info().startInstant().map(java.time.Instant::toEpochMilli).orElse(-1L);
        return me.pid() + " " + start + "\n";
    }

    /** Whether a temporary folder's owner is a live process (the same one that made it). */
    static boolean ownerAlive(Path tmp) throws IOException {
        Path abs = tmp.toAbsolutePath().normalize();
        synchronized (ACTIVE) {
            for (Publication p : ACTIVE) {
                if (p.tmp.equals(abs)) {
                    return true;
                }
            }
        }
        Path marker = tmp.resolve(OWNER);
        List<String> lines;
        try {
            lines = Files.readAllLines(marker, StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            lines = List.of();
        }
        if (lines.isEmpty()) {
            // Being made right now, or a run killed before its marker: wait a while before judging.
            FileTime t = Files.getLastModifiedTime(tmp, LinkOption.NOFOLLOW_LINKS);
            return System.currentTimeMillis() - t.toMillis() < UNMARKED_GRACE_MILLIS;
        }
        String[] f = lines.get(0).trim().split(" ");
        long pid;
        long start;
        try {
            pid = Long.parseLong(f[0]);
            start = f.length > 1 ? Long.parseLong(f[1]) : -1;
        } catch (NumberFormatException e) {
            return false;
        }
        Optional<ProcessHandle> h = ProcessHandle.of(pid);
        if (h.isEmpty() || !h.get().isAlive()) {
            return false;
        }
        long actual = h.get().info().startInstant().map(java.time.Instant::toEpochMilli).orElse(-1L);
        // A reused pid has another start time.
        return start < 0 || actual < 0 || actual == start;
    }

    /**
     * Removes the stale temporary folders of target {@code name} in parent (its lock is held),
     * putting back an old output that a killed run had moved aside, and deletes stale
     * temporary folders of other targets that hold no old output.
     */
    static void cleanStale(Path parent, String name) throws IOException {
        List<Path> found = new ArrayList<>();
        try (DirectoryStream<Path> s = Files.newDirectoryStream(parent, ".*" + TMP_TAG + "*")) {
            for (Path p : s) {
                found.add(p);
            }
        }
        String mine = "." + name + TMP_TAG;
        for (Path tmp : found) {
            try {
                if (!Files.isDirectory(tmp, LinkOption.NOFOLLOW_LINKS) || ownerAlive(tmp)) {
                    continue;
                }
                String n = tmp.getFileName().toString();
                boolean ours = n.startsWith(mine) && n.length() > mine.length() && n.indexOf(TMP_TAG, mine.length()) < 0;
                if (ours) {
                    restoreAside(tmp, parent.resolve(name));
                    deleteTree(tmp);
                } else if (!Files.exists(tmp.resolve(OLD))) {
                    deleteTree(tmp);
                }
            } catch (NoSuchFileException | java.io.UncheckedIOException e) {
                // finished and removed by its own run meanwhile
            }
        }
    }

    /** If tmp holds an old output moved aside and the target is missing, moves it back. */
    private static void restoreAside(Path tmp, Path target) throws IOException {
        Path old = tmp.resolve(OLD).resolve(target.getFileName().toString());
        if (Files.exists(old, LinkOption.NOFOLLOW_LINKS) && !Files.exists(target, LinkOption.NOFOLLOW_LINKS)) {
            move(old, target, false);
        }
    }

    // ---------------------------------------------------------------------------------------
    // File system steps

    // Temporary names are created private (0600, 0700); the finished output gets the usual modes.
    private static final String FILE_PERMISSIONS = "rw-r--r--";
    private static final String DIRECTORY_PERMISSIONS = "rwxr-xr-x";

    /** Gives a finished temporary file the usual mode and renames it onto its target (a private file). */
    static void publish(Path tmp, Path target) throws IOException {
        ordinaryPermissions(tmp, false);
        move(tmp, target, true);
    }

    private static void ordinaryPermissions(Path p, boolean directory) throws IOException {
        if (Files.getFileStore(p).supportsFileAttributeView(java.nio.file.attribute.PosixFileAttributeView.class)) {
            Files.setPosixFilePermissions(p, java.nio.file.attribute.PosixFilePermissions.fromString(
                    directory ? DIRECTORY_PERMISSIONS : FILE_PERMISSIONS));
        }
    }

    /** Publishes a file without replacing anything: link(2) fails on an existing name. */
    private static void linkOrMove(Path from, Path to) throws IOException {
        try {
            Files.createLink(to, from);
            Files.delete(from);
            return;
        } catch (FileAlreadyExistsException e) {
            throw BadInputException.at(to, "", "appeared while this output was being written",
                    "choose another output or pass --force to replace it");
        } catch (UnsupportedOperationException | IOException e) {
            // no hard links here: check and rename (the target's lock keeps obverse runs apart)
        }
        moveNoReplace(from, to);
    }

    private static void moveNoReplace(Path from, Path to) throws IOException {
        if (Files.exists(to, LinkOption.NOFOLLOW_LINKS)) {
            throw BadInputException.at(to, "", "appeared while this output was being written",
                    "choose another output or pass --force to replace it");
        }
        move(from, to, false);
    }

    private static void move(Path from, Path to, boolean replace) throws IOException {
        try {
            if (replace) {
                Files.move(from, to, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            } else {
                Files.move(from, to, StandardCopyOption.ATOMIC_MOVE);
            }
        } catch (AtomicMoveNotSupportedException e) {
            if (replace) {
                Files.move(from, to, StandardCopyOption.REPLACE_EXISTING);
            } else {
                Files.move(from, to);
            }
        }
    }

    /** Deletes a directory tree (or a file); links are removed, never followed. */
    public static void deleteTree(Path p) throws IOException {
        if (!Files.exists(p, LinkOption.NOFOLLOW_LINKS)) {
            return;
        }
        try (Stream<Path> walk = Files.walk(p)) {
            for (Path q : (Iterable<Path>) walk.sorted(Comparator.reverseOrder())::iterator) {
                Files.deleteIfExists(q);
            }
        }
    }

    /** Whether a directory has no entries. */
    public static boolean isEmptyDirectory(Path dir) throws IOException {
        try (DirectoryStream<Path> s = Files.newDirectoryStream(dir)) {
            return !s.iterator().hasNext();
        }
    }
}
