package org.outstage.logbook;

import java.time.Instant;
import java.util.Objects;
import java.util.Optional;

/** A sitting at the bench with one unit: a bias adjustment, a verification against a spec, or an evaluation. */
public record Session(long id, String unitName, SessionKind kind, Instant startedAt, Optional<Instant> endedAt, String notes) {
    public Session {
        Objects.requireNonNull(unitName, "unitName");
        Objects.requireNonNull(kind, "kind");
        Objects.requireNonNull(startedAt, "startedAt");
        Objects.requireNonNull(endedAt, "endedAt");
        Objects.requireNonNull(notes, "notes");
    }

    public boolean open() { return endedAt.isEmpty(); }
}
