package org.outstage.report;

import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.attribute.PosixFilePermissions;

/** Writes a text file whole or not at all: a temporary file in the same folder, then an atomic move. */
public final class AtomicFile {
    private AtomicFile() {}

    /** What fills the file. */
    @FunctionalInterface
    public interface Content {
        void writeTo(Writer w) throws IOException;
    }

    public static void write(Path target, Content content) throws IOException {
        Path abs = target.toAbsolutePath();
        Path dir = abs.getParent();
        Files.createDirectories(dir);
        Path tmp = Files.createTempFile(dir, abs.getFileName().toString(), ".part");
        try {
            try (Writer w = Files.newBufferedWriter(tmp, StandardCharsets.UTF_8)) {
                content.writeTo(w);
            }
            try {
                Files.setPosixFilePermissions(tmp, PosixFilePermissions.fromString("rw-r--r--"));
            } catch (UnsupportedOperationException e) {
                // not a POSIX file system: the temporary file's default permissions stand
            }
            Files.move(tmp, abs, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException | RuntimeException e) {
            Files.deleteIfExists(tmp);
            throw e;
        }
    }

    public static void write(Path target, String text) throws IOException {
        write(target, w -> w.write(text));
    }
}
