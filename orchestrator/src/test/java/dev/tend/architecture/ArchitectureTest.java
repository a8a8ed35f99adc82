package dev.tend.architecture;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import com.tngtech.archunit.lang.ArchRule;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

import static com.tngtech.archunit.core.domain.JavaClass.Predicates.resideInAPackage;
import static com.tngtech.archunit.core.domain.JavaClass.Predicates.resideOutsideOfPackage;
import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;

/**
 * The layout DEVELOPERS.md describes, checked on the compiled classes of every module (the
 * orchestrator's test class path holds them all): the engine stays free of adapter
 * libraries and of the adapters themselves, modules depend one way only, and nothing reaches
 * into another library's {@code internal} package (no promise of stability there).
 */
class ArchitectureTest {
    private static final String[] ORCHESTRATOR = {"dev.tend.engine..", "dev.tend.executor..", "dev.tend.runtime..",
            "dev.tend.api..", "dev.tend.cli..", "dev.tend.serve..", "dev.tend.metrics..", "dev.tend.replay..",
            "dev.tend.handover..", "dev.tend.demo..", "dev.tend.page..", "dev.tend.http..", "dev.tend.stream.."};
    private static JavaClasses classes;

    @BeforeAll
    static void importMainClasses() {
        classes = new ClassFileImporter().withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS).importPackages("dev.tend");
    }

    private static void check(ArchRule rule) {
        rule.check(classes);
    }

    @Test
    void engineImportsNoAdapterLibrary() {
        check(noClasses().that().resideInAPackage("dev.tend.engine..").should().dependOnClassesThat().resideInAnyPackage(
                "org.jdbi..", "io.javalin..", "org.quartz..", "picocli..", "java.net.http..", "java.sql..", "org.sqlite..",
                "org.postgresql..", "org.apache.kafka..", "io.prometheus..")
                .because("the engine is deterministic and does no I/O; adapters plug into its ports"));
    }

    @Test
    void engineDependsOnNoAdapter() {
        check(noClasses().that().resideInAPackage("dev.tend.engine..").should().dependOnClassesThat().resideInAnyPackage(
                "dev.tend.executor..", "dev.tend.runtime..", "dev.tend.api..", "dev.tend.cli..", "dev.tend.serve..",
                "dev.tend.metrics..", "dev.tend.replay..", "dev.tend.handover..", "dev.tend.demo..", "dev.tend.store..",
                "dev.tend.simulator..", "dev.tend.page..", "dev.tend.http..", "dev.tend.stream..")
                .because("adapters depend on the engine, never the reverse"));
    }

    @Test
    void onlyTheStreamAdapterUsesTheKafkaClient() {
        check(noClasses().that().resideOutsideOfPackage("dev.tend.stream..").should().dependOnClassesThat()
                .resideInAPackage("org.apache.kafka..")
                .because("the consumer is a thin adapter feeding the driver as the HTTP route does; nothing else knows Kafka"));
    }

    /**
     * The engine's parts (the run machine, the guards, the approval flow, the operator commands)
     * reach the engine around them through narrow host interfaces ({@code RunHost},
     * {@code ApprovalHost}, {@code CommandHost}), never through the engine itself. The one
     * exception is {@code EngineSnapshots}, the engine's own state taken out and put back,
     * kept in a file of its own only for length.
     */
    @Test
    void noPartOfTheEngineDependsOnTheEngineItself() {
        check(noClasses().that().resideInAPackage("dev.tend.engine..")
                .and().doNotHaveFullyQualifiedName("dev.tend.engine.Engine")
                .and().doNotHaveFullyQualifiedName("dev.tend.engine.Engine$Host")
                .and().doNotHaveFullyQualifiedName("dev.tend.engine.EngineSnapshots")
                .should().dependOnClassesThat().haveFullyQualifiedName("dev.tend.engine.Engine")
                .because("a part that reaches into the engine's state through accessors kept for it imports upward"));
    }

    @Test
    void sharedDependsOnNoOtherModule() {
        check(noClasses().that().resideInAPackage("dev.tend.shared..").should().dependOnClassesThat()
                .resideInAnyPackage(with(ORCHESTRATOR, "dev.tend.playbooks..", "dev.tend.store..", "dev.tend.simulator..")));
    }

    @Test
    void playbooksDependOnlyOnShared() {
        check(noClasses().that().resideInAPackage("dev.tend.playbooks..").should().dependOnClassesThat()
                .resideInAnyPackage(with(ORCHESTRATOR, "dev.tend.store..", "dev.tend.simulator..")));
    }

    @Test
    void storeAndSimulatorNeverDependOnTheOrchestrator() {
        check(noClasses().that().resideInAnyPackage("dev.tend.store..", "dev.tend.simulator..").should().dependOnClassesThat()
                .resideInAnyPackage(ORCHESTRATOR));
    }

    /** No exception: the start budgets are the engine's own rolling windows (DESIGN.md section 4). */
    @Test
    void nothingImportsALibrarysInternalPackage() {
        check(noClasses().that().resideInAPackage("dev.tend..")
                .should().dependOnClassesThat(
                resideInAPackage("..internal..").and(resideOutsideOfPackage("dev.tend.."))));
    }

    private static String[] with(String[] base, String... more) {
        String[] out = java.util.Arrays.copyOf(base, base.length + more.length);
        System.arraycopy(more, 0, out, base.length, more.length);
        return out;
    }
}
