package org.outstage.logbook;

import java.time.Instant;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Random;
import java.util.Set;
import org.outstage.json.JsonText;
import org.outstage.verify.KeyFigures;

/** Invented records for logbook tests (a fictional amplifier, seeded values). */
final class Fixtures {
    private Fixtures() {}

    static final Instant T0 = Instant.parse("2026-03-14T09:30:00.123456Z");

    static MeasurementRecord measurement(Random rnd, Optional<CaptureRef> cap, Instant at) {
        double thd = 1e-4 + rnd.nextDouble() * 1e-3;
        double g0 = 0.97 + rnd.nextDouble() * 0.06;
        KeyFigures f = KeyFigures.basic(1000.0 + rnd.nextGaussian() * 1e-3, 2.0 + rnd.nextDouble(), "V", thd, thd * 1.3)
                .withResidualRms(1e-4 * rnd.nextDouble())
                .withPower(0.5 + rnd.nextDouble(), 8.0)
                .withCrossover(g0, g0 < 0.995 ? "under-biased" : g0 > 1.005 ? "gm-doubling" : "near-optimal");
        if (rnd.nextBoolean()) f = f.withClipAsymmetry(rnd.nextGaussian() * 0.02);
        if (rnd.nextBoolean()) f = f.withCrossoverRatio(g0 - 0.002 * rnd.nextDouble());
        String json = JsonText.write(JsonText.obj("thd", thd, "gain_at_zero", g0, "note", "line\n\"quoted\", comma"));
        return new MeasurementRecord(1 + rnd.nextInt(2), cap, at, "outstage 0.1.0",
                Map.of("bandwidth", "20-20000", "harmonics", "10", "weighting", "none", "load", "8.0"),
                Set.of("harmonics", "weighting"), json, f);
    }

    static BiasStep step(Random rnd, int i, Optional<CaptureRef> cap) {
        Instant at = T0.plusSeconds(30L * i).plusNanos(rnd.nextInt(1_000_000) * 1000L);
        OptionalDouble hs = rnd.nextInt(4) == 0 ? OptionalDouble.empty() : OptionalDouble.of(25 + i * 0.7 + rnd.nextDouble());
        return BiasStep.draft(at, BiasReading.millivolts(5 + 2.5 * i + rnd.nextDouble()), hs, OptionalDouble.of(22.5), 1,
                rnd.nextInt(5) == 0 ? Optional.empty() : Optional.of(measurement(rnd, cap, at)));
    }

    /** A plain reading, no capture and no measurement (the many-writers test: contention, not bytes). */
    static BiasStep lightStep(Random rnd, int i) {
        return BiasStep.draft(T0.plusSeconds(i), BiasReading.millivolts(5 + 50 * rnd.nextDouble()), OptionalDouble.empty(),
                OptionalDouble.empty(), 1, Optional.empty());
    }

    static UnitUnderTest unit() {
        return new UnitUnderTest("DA-60 #7", Optional.of("SN-0007"), Optional.of("emitter follower"), Optional.of("recapped; new drivers"),
                OptionalDouble.of(60), OptionalDouble.of(8));
    }
}
