package org.obverse.campaign.spark;

import java.io.File;
import java.io.IOException;
import java.io.OutputStream;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.StandardCopyOption;
import java.util.concurrent.atomic.AtomicInteger;
import org.apache.hadoop.fs.FSDataOutputStream;
import org.apache.hadoop.fs.FileAlreadyExistsException;
import org.apache.hadoop.fs.FileStatus;
import org.apache.hadoop.fs.Options;
import org.apache.hadoop.fs.Path;
import org.apache.hadoop.fs.RawLocalFileSystem;
import org.apache.hadoop.fs.permission.FsPermission;
import org.apache.hadoop.util.Progressable;

/**
 * Two Hadoop file systems under schemes of their own, over the local disk, so that a test's
 * campaign folder is a URI that java.nio cannot open ({@code Path.of("testfs:///tmp/x")} is a
 * relative path that does not exist): everything the Spark engine reads or writes there goes
 * through Hadoop's FileSystem. Registered with {@code fs.SCHEME.impl} in the Hadoop
 * configuration (spark.hadoop.fs.SCHEME.impl in Spark's).
 */
public final class TestFileSystems {
    private TestFileSystems() {
    }

    /**
     * The local disk under another scheme. Statuses are plain: the local file system's own
     * status objects read permissions through java.io.File on the path's URI, which needs the
     * file scheme.
     */
    abstract static class UnderScheme extends RawLocalFileSystem {
        private final String scheme;

        UnderScheme(String scheme) {
            this.scheme = scheme;
        }

        @Override
        public URI getUri() {
            return URI.create(scheme + ":///");
        }

        @Override
        public String getScheme() {
            return scheme;
        }

        @Override
        public FileStatus getFileStatus(Path f) throws IOException {
            return plain(super.getFileStatus(f));
        }

        @Override
        public FileStatus[] listStatus(Path f) throws IOException {
            FileStatus[] all = super.listStatus(f);
            for (int k = 0; k < all.length; k++) {
                all[k] = plain(all[k]);
            }
            return all;
        }

        private static FileStatus plain(FileStatus s) {
            return new FileStatus(s.getLen(), s.isDirectory(), 1, s.getBlockSize(), s.getModificationTime(), s.getPath());
        }
    }

    /**
     * {@code testfs://}: rename as on HDFS — atomic; the plain rename refuses an existing target
     * (returns false), the rename with the overwrite option replaces it in one operation — and a
     * file being written is visible under its name while it is written. Counts the renames that
     * moved a file.
     */
    public static class AtomicRename extends UnderScheme {
        static final String SCHEME = "testfs";
        static final AtomicInteger RENAMES = new AtomicInteger();

        public AtomicRename() {
            super(SCHEME);
        }

        @Override
        public boolean rename(Path src, Path dst) throws IOException {
            if (pathToFile(dst).exists()) {
                return false;
            }
            RENAMES.incrementAndGet();
            Files.move(pathToFile(src).toPath(), pathToFile(dst).toPath(), StandardCopyOption.ATOMIC_MOVE);
            return true;
        }

        @Override
        protected void rename(Path src, Path dst, Options.Rename... options) throws IOException {
            if (!java.util.Arrays.asList(options).contains(Options.Rename.OVERWRITE) && pathToFile(dst).exists()) {
                throw new FileAlreadyExistsException(dst.toString());
            }
            RENAMES.incrementAndGet();
            Files.move(pathToFile(src).toPath(), pathToFile(dst).toPath(), StandardCopyOption.REPLACE_EXISTING,
                    StandardCopyOption.ATOMIC_MOVE);
        }
    }

    /**
     * {@code testobj://}: an object store. An object appears whole when its writer closes (the
     * bytes go to a hidden upload area first, as a multipart upload is committed at close), an
     * existing object is replaced, and rename is refused: a writer that renames fails here.
     * Counts objects created and renames tried.
     */
    public static class ObjectStore extends UnderScheme {
        static final String SCHEME = "testobj";
        static final AtomicInteger RENAMES = new AtomicInteger();
        static final AtomicInteger CREATES = new AtomicInteger();

        public ObjectStore() {
            super(SCHEME);
        }

        @Override
        public boolean rename(Path src, Path dst) throws IOException {
            RENAMES.incrementAndGet();
            throw new IOException("testobj: this store has no rename (" + src + " -> " + dst + ")");
        }

        @Override
        protected void rename(Path src, Path dst, Options.Rename... options) throws IOException {
            rename(src, dst);
        }

        @Override
        public FSDataOutputStream create(Path f, boolean overwrite, int bufferSize, short replication, long blockSize,
                                         Progressable progress) throws IOException {
            return upload(f, overwrite);
        }

        @Override
        public FSDataOutputStream create(Path f, FsPermission permission, boolean overwrite, int bufferSize,
                                         short replication, long blockSize, Progressable progress) throws IOException {
            return upload(f, overwrite);
        }

        private FSDataOutputStream upload(Path f, boolean overwrite) throws IOException {
            File target = pathToFile(f);
            if (!overwrite && target.exists()) {
                throw new FileAlreadyExistsException(f.toString());
            }
            CREATES.incrementAndGet();
            // An object store has no folders to make: a key's prefix exists once an object has it.
            Files.createDirectories(target.getParentFile().toPath());
            java.nio.file.Path pending = Files.createTempFile("testobj-upload-", ".bin");
            OutputStream file = Files.newOutputStream(pending);
            OutputStream committing = new OutputStream() {
                private boolean closed;

                @Override
                public void write(int b) throws IOException {
                    file.write(b);
                }

                @Override
                public void write(byte[] b, int off, int len) throws IOException {
                    file.write(b, off, len);
                }

                @Override
                public void close() throws IOException {
                    if (closed) {
                        return;
                    }
                    closed = true;
                    file.close();
                    Files.move(pending, target.toPath(), StandardCopyOption.REPLACE_EXISTING,
                            StandardCopyOption.ATOMIC_MOVE);
                }
            };
            return new FSDataOutputStream(committing, statistics);
        }
    }
}
