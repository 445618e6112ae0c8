package org.outstage.verify;

import java.util.List;
import java.util.Objects;

/** Every limit of a spec with its verdict. */
public record VerificationResult(SpecProfile spec, List<LimitResult> results) {
    public VerificationResult {
        Objects.requireNonNull(spec, "spec");
        results = List.copyOf(results);
    }

    public long count(Verdict v) { return results.stream().filter(r -> r.verdict() == v).count(); }

    public boolean anyFailed() { return count(Verdict.FAIL) > 0; }

    public boolean allPassed() { return count(Verdict.PASS) == results.size(); }

    public String summary() {
        return String.format("%d limit(s): %d pass, %d fail, %d not measured", results.size(), count(Verdict.PASS), count(Verdict.FAIL),
                count(Verdict.NOT_MEASURED));
    }
}
