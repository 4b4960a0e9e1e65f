package org.winnow.app;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static com.tngtech.archunit.library.dependencies.SlicesRuleDefinition.slices;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * The module graph is a DAG: geometry depends on nothing of ours, pipeline only on geometry, the three
 * stages never import each other, and the Kafka transport (module {@code kafka}) sits beside the stages,
 * used only by app (and bench): neither the stage contract nor a stage may reach it. Only app wires
 * them. Inside the scorer, one concern a package (network, index, reference, model, training, rules,
 * stage) without cycles, and training stays off the scoring path. Checked here on the compiled classes rather than left to memory.
 */
class ModuleBoundariesTest {
    private static JavaClasses classes;

    @BeforeAll
    static void importClasses() {
        classes = new ClassFileImporter()
                .withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
                .importPackages("org.winnow");
    }

    @Test
    void geometryDependsOnNothingOfOurs() {
        noClasses().that().resideInAPackage("org.winnow.geometry..")
                .should().dependOnClassesThat().resideInAnyPackage(
                        "org.winnow.pipeline..", "org.winnow.kafka..", "org.winnow.producer..", "org.winnow.scorer..",
                        "org.winnow.sink..", "org.winnow.app..", "org.winnow.bench..")
                .allowEmptyShould(true)
                .check(classes);
    }

    @Test
    void pipelineDependsOnlyOnGeometry() {
        noClasses().that().resideInAPackage("org.winnow.pipeline..")
                .should().dependOnClassesThat().resideInAnyPackage(
                        "org.winnow.kafka..", "org.winnow.producer..", "org.winnow.scorer..", "org.winnow.sink..",
                        "org.winnow.app..", "org.winnow.bench..")
                .allowEmptyShould(true)
                .check(classes);
    }

    @Test
    void kafkaTransportDependsOnlyOnPipelineAndGeometry() {
        noClasses().that().resideInAPackage("org.winnow.kafka..")
                .should().dependOnClassesThat().resideInAnyPackage(
                        "org.winnow.producer..", "org.winnow.scorer..", "org.winnow.sink..",
                        "org.winnow.app..", "org.winnow.bench..")
                .allowEmptyShould(true)
                .check(classes);
    }

    @Test
    void noStageUsesTheKafkaTransportOrItsClients() {
        noClasses().that().resideInAnyPackage("org.winnow.producer..", "org.winnow.scorer..", "org.winnow.sink..")
                .should().dependOnClassesThat().resideInAnyPackage("org.winnow.kafka..", "org.apache.kafka..")
                .allowEmptyShould(true)
                .check(classes);
    }

    @Test
    void pipelineUsesNoKafkaClients() {
        noClasses().that().resideInAPackage("org.winnow.pipeline..")
                .should().dependOnClassesThat().resideInAnyPackage("org.apache.kafka..", "com.esotericsoftware..")
                .allowEmptyShould(true)
                .check(classes);
    }

    @Test
    void producerImportsNeitherScorerNorSink() {
        stageIsolated("org.winnow.producer..", "org.winnow.scorer..", "org.winnow.sink..");
    }

    @Test
    void scorerImportsNeitherProducerNorSink() {
        stageIsolated("org.winnow.scorer..", "org.winnow.producer..", "org.winnow.sink..");
    }

    @Test
    void sinkImportsNeitherProducerNorScorer() {
        stageIsolated("org.winnow.sink..", "org.winnow.producer..", "org.winnow.scorer..");
    }

    @Test
    void theScoringPathNeverReachesTraining() {
        noClasses().that().resideInAnyPackage("org.winnow.scorer.stage..", "org.winnow.scorer.model..",
                        "org.winnow.scorer.network..", "org.winnow.scorer.index..", "org.winnow.scorer.rules..",
                        "org.winnow.scorer.reference..")
                .should().dependOnClassesThat().resideInAPackage("org.winnow.scorer.training..")
                .check(classes);
    }

    @Test
    void theScorersPackagesFormADag() {
        slices().matching("org.winnow.scorer.(*)..").should().beFreeOfCycles().check(classes);
    }

    private static void stageIsolated(String stage, String... others) {
        String[] forbidden = new String[others.length + 1];
        System.arraycopy(others, 0, forbidden, 0, others.length);
        forbidden[others.length] = "org.winnow.app..";
        noClasses().that().resideInAPackage(stage)
                .should().dependOnClassesThat().resideInAnyPackage(forbidden)
                .allowEmptyShould(true)
                .check(classes);
    }
}
