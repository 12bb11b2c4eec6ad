package org.tectomelt.architecture;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.Test;

/** The studies (Monte Carlo, inversion) are pure computation: no HTTP, no JSON, no entry point. */
class StudiesIndependenceTest {

    private static final JavaClasses CLASSES = new ClassFileImporter()
            .withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
            .importPackages("org.tectomelt");

    @Test
    void studiesImportNothingFromTheHttpOrJsonLayers() {
        noClasses().that().resideInAPackage("org.tectomelt.studies..")
                .should().dependOnClassesThat().resideInAnyPackage(
                        "io.javalin..", "com.fasterxml.jackson..", "org.eclipse.jetty..", "jakarta.servlet..",
                        "org.tectomelt.http..")
                .orShould().dependOnClassesThat().haveFullyQualifiedName("org.tectomelt.Main")
                .orShould().dependOnClassesThat().haveFullyQualifiedName("org.tectomelt.Config")
                .check(CLASSES);
    }

    @Test
    void theEngineDoesNotDependOnTheStudies() {
        noClasses().that().resideInAPackage("org.tectomelt.engine..")
                .should().dependOnClassesThat().resideInAPackage("org.tectomelt.studies..")
                .check(CLASSES);
    }
}
