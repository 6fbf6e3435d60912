package org.thermotile.jobs.architecture;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.classes;
import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static com.tngtech.archunit.library.dependencies.SlicesRuleDefinition.slices;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * The shape of the code, held as rules: the physics module knows nothing of Spark or of the jobs,
 * the jobs' packages form no cycle (each package a slice of its own, sub-packages included), and
 * the errors and storage packages are leaves that the others use.
 */
class ArchitectureTest {
    private static JavaClasses all;

    @BeforeAll
    static void importClasses() {
        all = new ClassFileImporter().withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
                .importPackages("org.thermotile");
    }

    @Test
    void modelIsPlainJava() {
        noClasses().that().resideInAPackage("org.thermotile.model..")
                .should().dependOnClassesThat().resideInAnyPackage("org.apache.spark..", "scala..",
                        "org.apache.hadoop..", "org.thermotile.jobs..")
                .because("model/ is plain Java physics, testable without Spark (DESIGN.md)")
                .check(all);
    }

    @Test
    void jobsPackagesFormNoCycle() {
        slices().matching("org.thermotile.jobs.(**)").should().beFreeOfCycles().check(all);
    }

    @Test
    void errorsAreALeaf() {
        classes().that().resideInAPackage("org.thermotile.jobs.errors..")
                .should().onlyDependOnClassesThat().resideInAnyPackage("java..", "org.thermotile.jobs.errors..")
                .check(all);
    }

    @Test
    void storageKnowsNoJob() {
        noClasses().that().resideInAPackage("org.thermotile.jobs.storage..")
                .should().dependOnClassesThat().resideInAnyPackage("org.thermotile.jobs.city..",
                        "org.thermotile.jobs.hotspots..", "org.thermotile.jobs.report..", "org.thermotile.jobs.cli..",
                        "org.thermotile.jobs.observe..")
                .because("staging, mirrors, publish-on-commit and canonical Parquet serve every job alike")
                .check(all);
    }
}
