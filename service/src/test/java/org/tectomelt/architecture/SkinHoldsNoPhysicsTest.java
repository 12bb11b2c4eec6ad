package org.tectomelt.architecture;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noFields;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.Test;

/**
 * The HTTP skin holds no physics: no floating-point constants (densities, temperatures, ranges
 * belong in the engine or the spec; computations are operations).
 */
class SkinHoldsNoPhysicsTest {

    private static final JavaClasses CLASSES = new ClassFileImporter()
            .withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
            .importPackages("org.tectomelt");

    @Test
    void httpDeclaresNoFloatingPointConstants() {
        noFields().that().areDeclaredInClassesThat().resideInAPackage("org.tectomelt.http..")
                .and().areStatic().and().areFinal()
                .should().haveRawType(double.class).orShould().haveRawType(float.class)
                .orShould().haveRawType(Double.class).orShould().haveRawType(Float.class)
                .check(CLASSES);
    }
}
