package dev.tend.cli;

import org.junit.jupiter.api.Test;

import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class ArchiveTrainingTest {
    private static final Path ROOT = CliRun.root();

    @Test
    void replaysTheRecordingAndReportsAHandoverOfTheStoreItMakes() throws Exception {
        int code = ArchiveTraining.train(new String[]{"replay", ROOT.resolve("simulator/recordings/zone-outage.jsonl").toString(),
                "--playbooks", ROOT.resolve("playbooks/library").toString()});
        assertThat(code).as("the first exit code of the replay and the handover that is not 0").isZero();
    }

    @Test
    void passesOnAFailingFirstPartsExitCode() throws Exception {
        int code = ArchiveTraining.train(new String[]{"replay", ROOT.resolve("simulator/recordings/no-such-recording.jsonl").toString(),
                "--playbooks", ROOT.resolve("playbooks/library").toString()});
        assertThat(code).isNotZero();
    }
}
