package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import javafx.application.Platform;
import javafx.scene.Scene;
import javafx.scene.control.CheckBox;
import javafx.scene.control.Label;
import javafx.scene.layout.StackPane;
import javafx.stage.Stage;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.report.ReportDocument;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/** The cautions page (domain.md, last section): shown on first start until dismissed, always from the Help menu. */
@ExtendWith(ApplicationExtension.class)
class CautionsTest {
    @TempDir Path config;
    private Stage stage;

    @Start
    void start(Stage s) {
        stage = s;
        s.setScene(new Scene(new StackPane(), 400, 300));
        s.show();
    }

    @AfterEach
    void clear() { System.clearProperty("outstage.config"); }

    @Test
    void firstStart_showsEveryCaution_andRemembersTheDismissal(FxRobot robot) {
        System.setProperty("outstage.config", config.toString());
        Path file = Cautions.dismissalFile();
        assertFalse(Cautions.dismissed(file), "a new configuration has not seen the cautions");
        Platform.runLater(() -> Workbench.showCautions(stage, true));
        WaitForAsyncUtils.waitForFxEvents();
        Label text = robot.lookup("#cautionsText").queryAs(Label.class);
        // the same wording as every report, so screen and paper say the same
        assertEquals(String.join("\n\n", ReportDocument.CAUTIONS), text.getText());
        assertTrue(text.getText().contains("soundcard input") && text.getText().contains("thermal runaway")
                && text.getText().contains("bridged output") && text.getText().contains("local electrical codes"));
        robot.clickOn(robot.lookup(".check-box").queryAs(CheckBox.class));
        robot.clickOn("OK");
        WaitForAsyncUtils.waitForFxEvents();
        assertTrue(Files.isRegularFile(file), "dismissal remembered in " + file);
        assertTrue(Cautions.dismissed(file));
    }

    @Test
    void firstStart_withoutTheTick_showsAgainNextTime(FxRobot robot) {
        System.setProperty("outstage.config", config.toString());
        Platform.runLater(() -> Workbench.showCautions(stage, true));
        WaitForAsyncUtils.waitForFxEvents();
        robot.clickOn("OK");
        WaitForAsyncUtils.waitForFxEvents();
        assertFalse(Cautions.dismissed(Cautions.dismissalFile()));
    }
}
