package org.outstage.capture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import org.junit.jupiter.api.Test;

/** The one definition of a channel's role (issue 11, finding 3). */
class ChannelRoleTest {
    @Test
    void referenceOrRolesName_theGenerator_everythingElseIsAnOutput() {
        assertEquals(List.of(ChannelRole.GENERATOR, ChannelRole.OUTPUT), ChannelRole.assign(2, OptionalInt.of(1), Optional.empty()));
        assertEquals(List.of(ChannelRole.OUTPUT, ChannelRole.OUTPUT), ChannelRole.assign(2, OptionalInt.empty(), Optional.empty()));
        assertEquals(List.of(ChannelRole.LEFT, ChannelRole.RIGHT),
                ChannelRole.assign(2, OptionalInt.empty(), Optional.of(ChannelRole.parseList("left,right"))));
        assertEquals(OptionalInt.of(2), ChannelRole.generatorChannel(ChannelRole.parseList("output, generator")));
    }

    @Test
    void badRoles_areRefusedWithTheReason() {
        assertEquals("\"amplifier\" is not a channel role (output, generator, left, right)",
                assertThrows(IllegalArgumentException.class, () -> ChannelRole.parseList("generator,amplifier")).getMessage());
        assertThrows(IllegalArgumentException.class, () -> ChannelRole.parseList("generator,generator"));
        assertThrows(IllegalArgumentException.class, () -> ChannelRole.assign(2, OptionalInt.of(2), Optional.of(ChannelRole.parseList("generator,output"))));
        assertThrows(IllegalArgumentException.class, () -> ChannelRole.assign(1, OptionalInt.of(2), Optional.empty()));
    }

    @Test
    void benchTxtRoles_giveTheGeneratorChannel() throws Exception {
        java.nio.file.Path d = java.nio.file.Files.createTempDirectory("roles");
        java.nio.file.Path f = d.resolve("bench.txt");
        java.nio.file.Files.writeString(f, "*.wav roles=output,generator\nbad.wav roles=gen,amplifier\n");
        assertThrows(CaptureFormatException.class, () -> BenchManifest.read(f));
        java.nio.file.Files.writeString(f, "*.wav roles=output,generator\n");
        BenchManifest m = BenchManifest.read(f);
        assertEquals(OptionalInt.of(2), m.entryFor(d.resolve("x.wav")).generatorChannel());
        assertEquals(List.of(ChannelRole.OUTPUT, ChannelRole.GENERATOR), m.entryFor(d.resolve("x.wav")).roles(2));
    }
}
