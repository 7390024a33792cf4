package org.obverse.io.codec;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.nio.file.Path;
import org.obverse.io.json.JsonFiles;

/**
 * A campaign folder's {@code prepared.json} ({@value #FORMAT}, spec/campaign.md): the hash of the
 * plan and every file it names as prepared, and the number of jobs. Written by the prepare step;
 * read by run, which resumes a folder only when the plan and its inputs hash the same.
 */
public final class PreparedCodec {
    /** The format tag. */
    public static final String FORMAT = "obverse.prepared/1";

    private PreparedCodec() {
    }

    /** The document's text. */
    public static String text(String inputsSha256, int jobs) {
        ObjectNode prepared = JsonFiles.newObject();
        prepared.put("format", FORMAT);
        prepared.put("inputs_sha256", inputsSha256);
        prepared.put("jobs", jobs);
        return JsonFiles.text(prepared);
    }

    /** The inputs hash a prepared folder recorded ("" where the document holds none). */
    public static String inputsSha256(Path file) {
        return JsonFiles.read(file, "prepared").path("inputs_sha256").asText();
    }
}
