package dev.tend.cli;

import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

/** {@code tend serve --kafka --topic --group}: options that do not fit together are refused before anything starts. */
class ServeKafkaOptionsTest {
    private static CliRun serve(String... extra) {
        String[] base = {"serve", "--port", "0", "--playbooks", CliRun.root().resolve("playbooks/library").toString(),
                "--fleet", CliRun.root().resolve("playbooks/library/fleet.yaml").toString()};
        String[] args = new String[base.length + extra.length];
        System.arraycopy(base, 0, args, 0, base.length);
        System.arraycopy(extra, 0, args, base.length, extra.length);
        return CliRun.of(args);
    }

    @Test
    void aTopicWithoutBrokersOrBrokersWithoutATopicIsRefused() {
        CliRun noBrokers = serve("--topic", "larkspur-health");
        assertThat(noBrokers.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(noBrokers.err()).contains("--topic goes with --kafka HOST:PORT");
        CliRun noTopic = serve("--kafka", "127.0.0.1:9092");
        assertThat(noTopic.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(noTopic.err()).contains("--kafka needs --topic TOPIC");
    }

    @Test
    void brokersAndTopicNamesAreCheckedBeforeAnythingStarts() {
        CliRun noPort = serve("--kafka", "stream-1.larkspur.example", "--topic", "larkspur-health");
        assertThat(noPort.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(noPort.err()).contains("--kafka wants HOST:PORT").contains("'stream-1.larkspur.example'");
        // a topic name holds letters, digits, '.', '_' and '-', at most 249 of them (the broker's rule, from memory)
        CliRun badTopic = serve("--kafka", "127.0.0.1:9092", "--topic", "larkspur health");
        assertThat(badTopic.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(badTopic.err()).contains("--topic wants a topic name").contains("'larkspur health'");
        CliRun tooLong = serve("--kafka", "127.0.0.1:9092", "--topic", "t".repeat(250));
        assertThat(tooLong.exit()).isEqualTo(ExitCodes.USAGE);
        CliRun blankGroup = serve("--kafka", "127.0.0.1:9092,127.0.0.2:9093", "--topic", "larkspur-health", "--group", " ");
        assertThat(blankGroup.exit()).isEqualTo(ExitCodes.USAGE);
        assertThat(blankGroup.err()).contains("--group must not be blank");
    }
}
