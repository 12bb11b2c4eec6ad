package org.tectomelt.architecture;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.Test;

/**
 * Operations are callable without HTTP: no Javalin, Jetty, servlet or Jackson type in them, and
 * they know nothing of the skin or of the contract layer that feeds them.
 */
class OperationsIndependenceTest {

    private static final JavaClasses CLASSES = new ClassFileImporter()
            .withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
            .importPackages("org.tectomelt");

    @Test
    void operationsImportNothingFromJavalinOrJackson() {
        noClasses().that().resideInAPackage("org.tectomelt.operations..")
                .should().dependOnClassesThat().resideInAnyPackage(
                        "io.javalin..", "com.fasterxml.jackson..", "org.eclipse.jetty..", "jakarta.servlet..",
                        "com.networknt..", "org.tectomelt.http..", "org.tectomelt.contract..")
                .check(CLASSES);
    }

    @Test
    void theContractLayerKnowsNothingOfHttp() {
        noClasses().that().resideInAPackage("org.tectomelt.contract..")
                .should().dependOnClassesThat().resideInAnyPackage(
                        "io.javalin..", "org.eclipse.jetty..", "jakarta.servlet..", "org.tectomelt.http..")
                .check(CLASSES);
    }
}
