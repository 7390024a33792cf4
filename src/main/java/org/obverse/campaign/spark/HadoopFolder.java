package org.obverse.campaign.spark;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.FileNotFoundException;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.file.Files;
import java.nio.file.StandardCopyOption;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.UUID;
import java.util.regex.Pattern;
import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.fs.FileStatus;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.FileUtil;
import org.apache.hadoop.fs.LocalFileSystem;
import org.apache.hadoop.fs.LocatedFileStatus;
import org.apache.hadoop.fs.Options;
import org.apache.hadoop.fs.Path;
import org.apache.hadoop.fs.RemoteIterator;
import org.obverse.io.BadInputException;

/**
 * A campaign folder on a Hadoop file system (hdfs://, s3a://, gs://, file://, or any scheme the
 * Hadoop configuration maps to a file system), read and written only through Hadoop's
 * {@link FileSystem}. Files come down to this machine whole ({@link #download}) and go up whole
 * ({@link #publish}) by one of two rules, chosen per scheme:
 *
 * <ul>
 *   <li>{@link Publish#RENAME}: write a temporary name beside the target, then rename over it.
 *       Right where rename is atomic and a file being written is visible under its name (HDFS,
 *       a local or POSIX file system);</li>
 *   <li>{@link Publish#DIRECT}: write the target itself. Right on object stores, whose objects
 *       appear whole when the writer closes (an upload is committed at close: S3 through s3a,
 *       Google Cloud Storage, Azure blobs through wasb), and whose rename is a copy and a delete,
 *       not atomic for folders and twice the traffic for files.</li>
 * </ul>
 *
 * Which rule: the Hadoop configuration key {@code obverse.publish.SCHEME} ({@code rename} or
 * {@code direct}) where set (with Spark: {@code --conf spark.hadoop.obverse.publish.abfs=direct}),
 * else {@code direct} for the object-store schemes of {@link #OBJECT_STORES}, else
 * {@code rename}. Hadoop has no capability a store reports for "rename is atomic"
 * ({@code hasPathCapability} covers appends, checksums, etags …), so the rule is by scheme;
 * renaming is the safe default, since even on an object store a one-file rename is a server-side
 * copy whose target appears whole.
 */
final class HadoopFolder {
    /** How a file appears whole under its name. */
    enum Publish { RENAME, DIRECT }

    /** Prefix of the configuration key that overrides the rule for one scheme. */
    static final String PUBLISH_KEY = "obverse.publish.";

    /** Object stores with atomic object creation on close (their connectors' documented semantics). */
    static final Set<String> OBJECT_STORES = Set.of("s3a", "s3", "s3n", "gs", "wasb", "wasbs", "oss", "cosn", "obs");

    /** Temporary names this class writes (and a stopped run may leave): .NAME.ID.part */
    private static final Pattern TEMPORARY = Pattern.compile("^\\..+\\.part$");

    private final FileSystem fs;
    private final Path root;
    private final Publish publish;
    /** The folder as the user wrote it, for messages. */
    private final String given;

    private HadoopFolder(FileSystem fs, Path root, Publish publish, String given) {
        this.fs = fs;
        this.root = root;
        this.publish = publish;
        this.given = given;
    }

    /** The folder at a URI; its file system is Hadoop's for the scheme under this configuration. */
    static HadoopFolder open(String uri, Configuration conf) throws IOException {
        Path root = new Path(uri);
        FileSystem fs;
        try {
            fs = root.getFileSystem(conf);
        } catch (org.apache.hadoop.fs.UnsupportedFileSystemException e) {
            throw new BadInputException(uri + ": Hadoop knows no file system for the scheme '" + root.toUri().getScheme()
                    + "'; put its connector (hadoop-aws for s3a, gcs-connector for gs …) on the class path with "
                    + "spark-submit --jars or --packages, or set fs." + root.toUri().getScheme() + ".impl");
        }
        // The local file system writes checksum files beside each file; the raw one does not.
        if (fs instanceof LocalFileSystem local) {
            fs = local.getRawFileSystem();
        }
        root = fs.makeQualified(root);
        String given = uri.endsWith("/") ? uri.substring(0, uri.length() - 1) : uri;
        return new HadoopFolder(fs, root, rule(root.toUri().getScheme(), conf), given);
    }

    /** The publishing rule for a scheme: the configuration's, else direct for object stores, else rename. */
    static Publish rule(String scheme, Configuration conf) {
        String s = scheme == null ? "" : scheme.toLowerCase(Locale.ROOT);
        String set = conf.getTrimmed(PUBLISH_KEY + s);
        if (set != null) {
            return switch (set.toLowerCase(Locale.ROOT)) {
                case "rename" -> Publish.RENAME;
                case "direct" -> Publish.DIRECT;
                default -> throw new BadInputException(PUBLISH_KEY + s + " = " + set + ": use rename (file systems with "
                        + "atomic rename, such as HDFS) or direct (object stores)");
            };
        }
        return OBJECT_STORES.contains(s) ? Publish.DIRECT : Publish.RENAME;
    }

    Publish publish() {
        return publish;
    }

    /** The folder's URI, qualified (scheme and authority). */
    String uri() {
        return root.toString();
    }

    /** A file or folder of the campaign folder by relative path ("" for the folder itself). */
    Path at(String relative) {
        return relative.isEmpty() ? root : new Path(root, relative);
    }

    /** Where a file of the folder is, for messages: as the user named the folder. */
    String describe(String relative) {
        return relative.isEmpty() ? given : given + "/" + relative;
    }

    boolean exists(String relative) throws IOException {
        return fs.exists(at(relative));
    }

    boolean isFile(String relative) throws IOException {
        try {
            return fs.getFileStatus(at(relative)).isFile();
        } catch (FileNotFoundException e) {
            return false;
        }
    }

    /** The files directly in a sub-folder (temporary names left out), name → length; empty where it is absent. */
    Map<String, Long> list(String sub) throws IOException {
        Map<String, Long> out = new LinkedHashMap<>();
        try {
            for (FileStatus st : fs.listStatus(at(sub))) {
                String n = st.getPath().getName();
                if (st.isFile() && !TEMPORARY.matcher(n).matches()) {
                    out.put(n, st.getLen());
                }
            }
        } catch (FileNotFoundException e) {
            // no such folder yet: no files
        }
        return out;
    }

    /** Removes the temporary files a stopped run left directly in a sub-folder. */
    void removeTemporary(String sub) throws IOException {
        try {
            for (FileStatus st : fs.listStatus(at(sub))) {
                if (st.isFile() && TEMPORARY.matcher(st.getPath().getName()).matches()) {
                    fs.delete(st.getPath(), false);
                }
            }
        } catch (FileNotFoundException e) {
            // nothing to remove
        }
    }

    /**
     * Copies a file of the folder to a local file, whole: into a temporary name beside it, then
     * moved over it, so a concurrent reader on this machine never sees part of it.
     */
    void download(String relative, java.nio.file.Path local) throws IOException {
        Files.createDirectories(local.toAbsolutePath().getParent());
        java.nio.file.Path part = local.resolveSibling("." + local.getFileName() + "." + UUID.randomUUID() + ".part");
        try (InputStream in = fs.open(at(relative))) {
            Files.copy(in, part);
            Files.move(part, local, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } finally {
            Files.deleteIfExists(part);
        }
    }

    /** Copies every file under a sub-folder (recursively, temporary names left out) below a local root. */
    void downloadTree(String sub, java.nio.file.Path localRoot) throws IOException {
        RemoteIterator<LocatedFileStatus> it;
        try {
            it = fs.listFiles(at(sub), true);
        } catch (FileNotFoundException e) {
            return;
        }
        String base = at("").toUri().getPath();
        while (it.hasNext()) {
            LocatedFileStatus st = it.next();
            if (TEMPORARY.matcher(st.getPath().getName()).matches()) {
                continue;
            }
            String rel = relative(base, st.getPath());
            download(rel, localRoot.resolve(rel));
        }
    }

    private static String relative(String base, Path p) {
        String path = p.toUri().getPath();
        String b = base.endsWith("/") ? base : base + "/";
        if (!path.startsWith(b)) {
            throw new IllegalStateException(p + " is not under " + base);
        }
        return path.substring(b.length());
    }

    /** Publishes a local file as a file of the folder, replacing it, whole by the folder's rule. */
    void publish(java.nio.file.Path local, String relative) throws IOException {
        Path target = at(relative);
        if (publish == Publish.DIRECT) {
            try (OutputStream out = fs.create(target, true)) {
                Files.copy(local, out);
            }
            return;
        }
        Path part = new Path(target.getParent(), "." + target.getName() + "." + UUID.randomUUID() + ".part");
        boolean moved = false;
        try {
            try (OutputStream out = fs.create(part, false)) {
                Files.copy(local, out);
            }
            // A plain rename first: atomic, and on HDFS it refuses an existing target, which only a
            // second attempt of a job (or a table collected again) meets; then rename with the
            // overwrite option, also one atomic operation on HDFS.
            if (!fs.rename(part, target)) {
                FileUtil.rename(fs, part, target, Options.Rename.OVERWRITE);
            }
            moved = true;
        } finally {
            if (!moved) {
                fs.delete(part, false);
            }
        }
    }

    /** Uploads a whole local folder, file by file, each by {@link #publish}; the files named last go last. */
    void upload(java.nio.file.Path localRoot, Set<String> last) throws IOException {
        java.util.List<String> later = new java.util.ArrayList<>();
        try (var files = Files.walk(localRoot)) {
            for (java.nio.file.Path p : (Iterable<java.nio.file.Path>) files.sorted()::iterator) {
                if (!Files.isRegularFile(p)) {
                    continue;
                }
                String rel = localRoot.relativize(p).toString().replace(java.io.File.separatorChar, '/');
                if (last.contains(rel)) {
                    later.add(rel);
                } else {
                    publish(p, rel);
                }
            }
        }
        for (String rel : last) {
            if (later.contains(rel)) {
                publish(localRoot.resolve(rel), rel);
            }
        }
    }

    /** Deletes the whole folder. */
    void deleteAll() throws IOException {
        fs.delete(root, true);
    }

    /** The Hadoop configuration as bytes, to ship to every executor (it carries spark.hadoop.* settings). */
    static byte[] toBytes(Configuration conf) {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        try (DataOutputStream out = new DataOutputStream(b)) {
            conf.write(out);
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
        return b.toByteArray();
    }

    static Configuration fromBytes(byte[] bytes) throws IOException {
        Configuration conf = new Configuration(false);
        try (DataInputStream in = new DataInputStream(new ByteArrayInputStream(bytes))) {
            conf.readFields(in);
        }
        return conf;
    }
}
