package org.outstage;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.Test;

/** Keeps the arrows of ../shared/design.md pointing one way. */
class ArchitectureTest {
    private static final JavaClasses MAIN = new ClassFileImporter()
            .withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
            .importPackages("org.outstage");

    @Test
    void onlyUi_importsJavaFx() {
        noClasses().that().resideOutsideOfPackage("org.outstage.ui..")
                .should().dependOnClassesThat().resideInAnyPackage("javafx..", "org.controlsfx..")
                .check(MAIN);
    }

    @Test
    void corePackages_importNoCliJdbcOrUi() {
        noClasses().that().resideInAnyPackage("org.outstage.capture..", "org.outstage.analysis..", "org.outstage.model..", "org.outstage.plot..")
                .should().dependOnClassesThat().resideInAnyPackage("picocli..", "java.sql..", "org.sqlite..", "org.outstage.cli..", "org.outstage.ui..",
                        "org.outstage.report..", "org.outstage.logbook..", "org.outstage.verify..")
                .check(MAIN);
    }

    @Test
    void commonsMath_isOnlyATestReference() {
        noClasses().should().dependOnClassesThat().resideInAnyPackage("org.apache.commons.math3..").check(MAIN);
    }

    @Test
    void capture_doesNotReachUpstream() {
        noClasses().that().resideInAPackage("org.outstage.capture..")
                .should().dependOnClassesThat().resideInAnyPackage("org.outstage.analysis..", "org.outstage.model..", "org.outstage.plot..")
                .check(MAIN);
    }

    @Test
    void analysis_doesNotImportModelOrPlot() {
        noClasses().that().resideInAPackage("org.outstage.analysis..")
                .should().dependOnClassesThat().resideInAnyPackage("org.outstage.model..", "org.outstage.plot..")
                .check(MAIN);
    }

    @Test
    void model_knowsNothingOfFilesOrCaptures() {
        noClasses().that().resideInAPackage("org.outstage.model..")
                .should().dependOnClassesThat().resideInAnyPackage("org.outstage.capture..", "org.outstage.plot..")
                .check(MAIN);
    }

    @Test
    void logbookAndVerify_doNotImportReportCliOrUi() {
        noClasses().that().resideInAnyPackage("org.outstage.logbook..", "org.outstage.verify..")
                .should().dependOnClassesThat().resideInAnyPackage("org.outstage.report..", "org.outstage.cli..", "org.outstage.ui..")
                .check(MAIN);
    }

    @Test
    void report_doesNotImportCliOrUi() {
        noClasses().that().resideInAPackage("org.outstage.report..")
                .should().dependOnClassesThat().resideInAnyPackage("org.outstage.cli..", "org.outstage.ui..")
                .check(MAIN);
    }

    @Test
    void onlyTheLogbook_reachesThePoolMigrationsAndDriver() {
        noClasses().that().resideOutsideOfPackage("org.outstage.logbook..")
                .should().dependOnClassesThat().resideInAnyPackage("com.zaxxer..", "org.flywaydb..", "org.postgresql..")
                .check(MAIN);
    }

    @Test
    void onlyJson_importsJackson() {
        noClasses().that().resideOutsideOfPackage("org.outstage.json..")
                .should().dependOnClassesThat().resideInAnyPackage("com.fasterxml.jackson..")
                .check(MAIN);
    }

    @Test
    void stimulus_importsNothingOfOursAndNoAudio() {
        noClasses().that().resideInAPackage("org.outstage.stimulus..")
                .should().dependOnClassesThat().resideInAnyPackage("org.outstage.capture..", "org.outstage.analysis..", "org.outstage.model..",
                        "org.outstage.audio..", "org.outstage.live..", "org.outstage.cli..", "org.outstage.ui..", "org.outstage.report..",
                        "org.outstage.logbook..", "org.outstage.verify..", "org.outstage.plot..", "org.outstage.json..", "javax.sound..",
                        "java.io..", "java.nio..", "picocli..")
                .check(MAIN);
    }

    @Test
    void audio_importsOnlyStimulusCaptureAndJdk() {
        noClasses().that().resideInAPackage("org.outstage.audio..")
                .should().dependOnClassesThat().resideInAnyPackage("org.outstage.analysis..", "org.outstage.model..", "org.outstage.live..",
                        "org.outstage.cli..", "org.outstage.ui..", "org.outstage.report..", "org.outstage.logbook..", "org.outstage.verify..",
                        "org.outstage.plot..", "picocli..")
                .check(MAIN);
    }

    @Test
    void live_importsNoCliUiOrPicocli() {
        noClasses().that().resideInAPackage("org.outstage.live..")
                .should().dependOnClassesThat().resideInAnyPackage("org.outstage.cli..", "org.outstage.ui..", "org.outstage.report..",
                        "org.outstage.logbook..", "picocli..", "java.sql..")
                .check(MAIN);
    }

    @Test
    void onlyAudio_importsJavaSound() {
        noClasses().that().resideOutsideOfPackage("org.outstage.audio..")
                .should().dependOnClassesThat().resideInAnyPackage("javax.sound..")
                .check(MAIN);
    }
}
