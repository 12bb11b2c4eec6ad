package org.tectomelt.architecture;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.Test;

/** The engine is pure computation: it must not know about HTTP, JSON or the web framework. */
class EngineIndependenceTest {

    private static final JavaClasses CLASSES = new ClassFileImporter()
            .withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
            .importPackages("org.tectomelt");

    @Test
    void engineImportsNothingFromTheHttpOrJsonLayers() {
        noClasses().that().resideInAPackage("org.tectomelt.engine..")
                .should().dependOnClassesThat().resideInAnyPackage(
                        "io.javalin..", "com.fasterxml.jackson..", "org.eclipse.jetty..", "jakarta.servlet..",
                        "org.tectomelt.http..")
                .check(CLASSES);
    }

    @Test
    void engineDoesNotDependOnTheEntryPoint() {
        noClasses().that().resideInAPackage("org.tectomelt.engine..")
                .should().dependOnClassesThat().haveFullyQualifiedName("org.tectomelt.Main")
                .orShould().dependOnClassesThat().haveFullyQualifiedName("org.tectomelt.Config")
                .check(CLASSES);
    }
}
