package org.outstage.logbook;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Optional;
import java.util.Random;

/**
 * Child process for {@link NothingLostTest}: adds steps (each with a small capture) to session {@code args[1]}
 * of logbook {@code args[0]} and prints "saved SEQ" after each commit, until killed (or, with {@code args[3]},
 * until that many steps are saved).
 */
public final class KillWriterMain {
    private KillWriterMain() {}

    public static void main(String[] args) throws Exception {
        Path db = Path.of(args[0]);
        long session = Long.parseLong(args[1]);
        Random rnd = new Random(Long.parseLong(args[2]));
        long max = args.length > 3 ? Long.parseLong(args[3]) : Long.MAX_VALUE;
        Path scratch = Files.createTempDirectory(db.getParent(), "writer");
        try (Logbook lb = Logbook.open(db)) {
            for (int i = 0; i < max; i++) {
                Path cap = scratch.resolve("c" + i + ".wav");
                byte[] b = new byte[2000 + rnd.nextInt(20000)];
                rnd.nextBytes(b);
                Files.write(cap, b);
                CaptureRef ref = lb.storeCapture(cap);
                BiasStep s = lb.addBiasStep(session, Fixtures.step(rnd, i, Optional.of(ref)));
                System.out.println("saved " + s.seq() + " " + ref.sha256());
                System.out.flush();
            }
        }
    }
}
