package org.outstage;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * With no command the launcher opens the workbench where a display exists, else runs the bench job. Windows and macOS
 * set no DISPLAY variable, yet have their desktop: before, a double-clicked image there ran the bench job unseen.
 */
class LauncherDisplayTest {
    @Test
    void linux_needsAnX11OrWaylandDisplay() {
        assertFalse(Launcher.hasDisplay("Linux", Map.of(), false));
        assertFalse(Launcher.hasDisplay("Linux", Map.of("DISPLAY", " "), false));
        assertTrue(Launcher.hasDisplay("Linux", Map.of("DISPLAY", ":0"), false));
        assertTrue(Launcher.hasDisplay("Linux", Map.of("WAYLAND_DISPLAY", "wayland-0"), false));
    }

    @Test
    void windowsAndMacOs_haveTheirDesktop() {
        assertTrue(Launcher.hasDisplay("Windows 11", Map.of(), false));
        assertTrue(Launcher.hasDisplay("Mac OS X", Map.of(), false));
    }

    @Test
    void headless_neverOpensTheWorkbench() {
        assertFalse(Launcher.hasDisplay("Linux", Map.of("DISPLAY", ":0"), true));
        assertFalse(Launcher.hasDisplay("Windows 11", Map.of(), true));
    }
}
