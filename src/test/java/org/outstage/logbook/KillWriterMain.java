package org.outstage.logbook;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Optional;
import java.util.Random;

/**
 * Child process for {@link NothingLostTest}: adds steps to session {@code args[2]} of logbook {@code args[0]} (a file
 * or a server URL), writing its captures in the scratch folder {@code args[1]} first, and prints "saved SEQ SHA" after
 * each commit, until killed (or, with {@code args[4]}, until that many steps are saved). With {@code args[5]} =
 * {@code light} the steps carry no capture and no measurement (the many-writers test: the contention, not the bytes).
 */
public final class KillWriterMain {
    private KillWriterMain() {}

    public static void main(String[] args) throws Exception {
        String location = args[0];
        Path scratch = Files.createTempDirectory(Path.of(args[1]), "writer");
        long session = Long.parseLong(args[2]);
        Random rnd = new Random(Long.parseLong(args[3]));
        long max = args.length > 4 ? Long.parseLong(args[4]) : Long.MAX_VALUE;
        boolean light = args.length > 5 && args[5].equals("light");
        try (Logbook lb = Logbook.open(location)) {
            for (int i = 0; i < max; i++) {
                if (light) {
                    BiasStep s = lb.addBiasStep(session, Fixtures.lightStep(rnd, i));
                    System.out.println("saved " + s.seq() + " -");
                } else {
                    Path cap = scratch.resolve("c" + i + ".wav");
                    byte[] b = new byte[2000 + rnd.nextInt(20000)];
                    rnd.nextBytes(b);
                    Files.write(cap, b);
                    CaptureRef ref = lb.storeCapture(cap);
                    BiasStep s = lb.addBiasStep(session, Fixtures.step(rnd, i, Optional.of(ref)));
                    System.out.println("saved " + s.seq() + " " + ref.sha256());
                }
                System.out.flush();
            }
        }
    }
}
