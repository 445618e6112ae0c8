package org.outstage.cli;

import java.io.IOException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.BasicFileAttributes;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * Finds captures that have appeared in a folder and are complete: a file counts as written when its size
 * and modification time have not changed for {@code stableNanos} (a recorder or scope may write it in
 * pieces). Polls; no platform file events, so it behaves the same on every file system.
 */
final class WatchFolder {
    private static final Set<String> EXTENSIONS = Set.of(".wav", ".csv", ".txt", ".rf64", ".w64");

    private final Path dir;
    private final long stableNanos;
    private final Set<Path> done = new HashSet<>();
    private final Map<Path, long[]> seen = new HashMap<>(); // size, mtime, nanoTime of last change

    WatchFolder(Path dir, long stableNanos, boolean includeExisting) throws IOException {
        this.dir = dir;
        this.stableNanos = stableNanos;
        if (!includeExisting) done.addAll(list());
    }

    /** Files that became complete since the last call, oldest first by modification time. */
    List<Path> poll(long nowNanos) throws IOException {
        List<Path> ready = new ArrayList<>();
        for (Path p : list()) {
            if (done.contains(p)) continue;
            BasicFileAttributes a;
            try {
                a = Files.readAttributes(p, BasicFileAttributes.class);
            } catch (IOException gone) {
                seen.remove(p);
                continue;
            }
            long size = a.size();
            long mtime = a.lastModifiedTime().toMillis();
            long[] prev = seen.get(p);
            if (prev == null || prev[0] != size || prev[1] != mtime) {
                seen.put(p, new long[] {size, mtime, nowNanos});
            } else if (nowNanos - prev[2] >= stableNanos && size > 0) {
                ready.add(p);
            }
        }
        ready.sort((x, y) -> Long.compare(seen.get(x)[1], seen.get(y)[1]));
        for (Path p : ready) {
            done.add(p);
            seen.remove(p);
        }
        return ready;
    }

    private List<Path> list() throws IOException {
        List<Path> out = new ArrayList<>();
        try (DirectoryStream<Path> ds = Files.newDirectoryStream(dir)) {
            for (Path p : ds) {
                String n = p.getFileName().toString().toLowerCase(Locale.ROOT);
                if (n.startsWith(".") || !Files.isRegularFile(p)) continue;
                int dot = n.lastIndexOf('.');
                if (dot > 0 && EXTENSIONS.contains(n.substring(dot))) out.add(p);
            }
        }
        return out;
    }
}
