package dev.tend.playbooks.load;

import dev.tend.playbooks.CommandChannel;
import dev.tend.playbooks.EmailChannel;
import dev.tend.playbooks.HttpAction;
import dev.tend.playbooks.LogChannel;
import dev.tend.playbooks.Paging;
import dev.tend.playbooks.TendConfig;
import dev.tend.playbooks.TestDir;
import dev.tend.playbooks.WebhookChannel;
import dev.tend.shared.Id;
import dev.tend.shared.Problem;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.net.URI;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** channels: and pages: in tend.yaml, the shared HTTP client keys, and channel names checked everywhere they are used. */
class ChannelsConfigTest {
    @TempDir
    Path tmp;

    private static List<Problem> problems(String text) {
        return TestDir.problems(() -> PlaybookLoader.parseConfig("/etc/tend/tend.yaml", text));
    }

    @Test
    void everyKindOfChannelLoadsWithItsDefaultsAndPathsResolvedAgainstTheFile() {
        TendConfig c = PlaybookLoader.parseConfig("/etc/tend/tend.yaml", """
                channels:
                  oncall:
                    webhook:
                      url: https://pager.larkspur.example/hooks/tend
                      bearer-token-file: secrets/pager.token
                      ca-bundle: /etc/ssl/larkspur-ca.pem
                      client-cert: tend.pem
                      client-key: tend.key
                      headers: { X-Larkspur-Team: platform }
                      body: { text: "{message}", page: "{id}", count: 3 }
                    give-up-after: 2h
                  platform-mail:
                    email: { host: smtp.larkspur.example, security: starttls, from: tend@larkspur.example, to: ops@larkspur.example }
                  desk:
                    command: [/usr/local/bin/larkspur-desk, "{message}", --ref, "{id}"]
                    timeout: 20s
                  journal:
                    log: {}
                pages:
                  console-url: https://tend.larkspur.example
                  brake-gather: 1m
                """);
        Paging p = c.paging();
        assertThat(p.channels()).containsOnlyKeys(Id.of("oncall"), Id.of("platform-mail"), Id.of("desk"), Id.of("journal"));
        WebhookChannel w = (WebhookChannel) p.channels().get(Id.of("oncall"));
        assertThat(w.url()).isEqualTo(URI.create("https://pager.larkspur.example/hooks/tend"));
        assertThat(w.client().bearerTokenFile()).isEqualTo(Path.of("/etc/tend/secrets/pager.token"));
        assertThat(w.client().clientKey()).isEqualTo(Path.of("/etc/tend/tend.key"));
        assertThat(w.client().caBundle()).isEqualTo(Path.of("/etc/ssl/larkspur-ca.pem"));
        assertThat(w.client().headers()).containsEntry("X-Larkspur-Team", "platform");
        assertThat(w.body().body()).containsEntry("count", 3L).containsEntry("text", "{message}");
        assertThat(w.retries()).isEqualTo(WebhookChannel.DEFAULT_RETRIES);
        assertThat(w.giveUpAfter()).isEqualTo(Duration.ofHours(2));
        EmailChannel e = (EmailChannel) p.channels().get(Id.of("platform-mail"));
        assertThat(e.port()).as("the submission port for STARTTLS (RFC 6409)").isEqualTo(587);
        assertThat(e.to()).containsExactly("ops@larkspur.example");
        assertThat(((CommandChannel) p.channels().get(Id.of("desk"))).timeout()).isEqualTo(Duration.ofSeconds(20));
        assertThat(p.channels().get(Id.of("journal"))).isInstanceOf(LogChannel.class);
        assertThat(p.channel()).isEqualTo(Id.of("oncall"));
        assertThat(p.consoleUrl()).isEqualTo("https://tend.larkspur.example/");
        assertThat(p.brakeGather()).isEqualTo(Duration.ofMinutes(1));
    }

    @Test
    void withoutChannelsEveryNameGoesToTheLog() {
        Paging p = PlaybookLoader.parseConfig("tend.yaml", "rate: 10/1h\n").paging();
        assertThat(p.isConfigured()).isFalse();
        assertThat(p.channel(Id.of("anything"))).get().isInstanceOf(LogChannel.class);
    }

    @Test
    void badChannelsAreReportedWithFileLineAndField() {
        String text = """
                channels:
                  oncall:
                    webhook: { url: ftp://pager.larkspur.example, retries: 20, headers: { Authorization: secret } }
                  mail:
                    email: { host: smtp.larkspur.example, security: ssl, from: tend, to: [] }
                  desk:
                    command: "/usr/local/bin/desk {message}"
                  both:
                    log: {}
                    command: [echo]
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly(
                "/etc/tend/tend.yaml:3:21: channel oncall.webhook.url: must be an absolute http:// or https:// URL with a host, got 'ftp://pager.larkspur.example'",
                "/etc/tend/tend.yaml:3:60: channel oncall.webhook.retries: must be between 0 and 10, got 20",
                "/etc/tend/tend.yaml:3:75: channel oncall.webhook.headers: header 'Authorization' is set by tend itself; give a bearer token with"
                        + " bearer-token-file, never in the configuration",
                "/etc/tend/tend.yaml:5:53: channel mail.email.security: must be starttls, tls or none, got 'ssl'",
                "/etc/tend/tend.yaml:5:64: channel mail.email.from: must be one mail address such as oncall@larkspur.example, got 'tend'",
                "/etc/tend/tend.yaml:5:74: channel mail.email.to lists no address",
                "/etc/tend/tend.yaml:7:14: channel desk.command must be a list of arguments such as [notify-desk, \"{message}\"], not one string:"
                        + " tend never runs a shell",
                "/etc/tend/tend.yaml:9:5: channel both has both 'command' and 'log'; a channel is exactly one kind");
    }

    @Test
    void unknownChannelNamesInTendYamlAreErrorsWithTheNearestDefinedName() {
        String text = """
                brake:
                  engage-at: { clusters: 20 }
                  page: on-call
                channels:
                  oncall:
                    log: {}
                  platform-mail:
                    email: { host: smtp.larkspur.example, security: tls, from: tend@larkspur.example, to: [ops@larkspur.example] }
                pages:
                  channel: platfrom-mail
                """;
        assertThat(problems(text)).extracting(Problem::toString).containsExactly(
                "/etc/tend/tend.yaml:3:9: brake.page: unknown channel 'on-call' (did you mean 'oncall'?); the channels defined in"
                        + " tend.yaml are: oncall, platform-mail",
                "/etc/tend/tend.yaml:10:12: pages.channel: unknown channel 'platfrom-mail' (did you mean 'platform-mail'?); the channels"
                        + " defined in tend.yaml are: oncall, platform-mail");
        assertThat(problems("channels:\n  platform-mail:\n    log: {}\n")).extracting(Problem::toString).containsExactly(
                "/etc/tend/tend.yaml:2:3: tend's own pages (flapping, loops, runs that need a person, approvals) go to 'oncall', which is"
                        + " not defined here; define it, or name another with pages.channel");
    }

    @Test
    void aPlaybookPagingAnUnknownChannelIsAnErrorAtItsStep() {
        TestDir d = new TestDir(tmp);
        d.write("actions.yaml", TestDir.ACTIONS);
        d.write("tend.yaml", """
                channels:
                  oncall:
                    log: {}
                  platform-mail:
                    email: { host: smtp.larkspur.example, security: tls, from: tend@larkspur.example, to: [ops@larkspur.example] }
                """);
        d.write("replace.yaml", """
                playbook: replace-silent-node
                trigger: { signal: heartbeat, state: silent, scope: node }
                steps:
                  - { id: drain, action: drain-node, timeout: 5m }
                on-failure:
                  - { id: tell, page: oncal, message: "draining {node} failed" }
                """);
        assertThat(TestDir.problems(() -> PlaybookLoader.load(tmp))).extracting(Problem::toString).containsExactly(
                d.source("replace.yaml") + ":6:5: step tell: unknown channel 'oncal' (did you mean 'oncall'?); the channels"
                        + " defined in tend.yaml are: oncall, platform-mail");
    }

    @Test
    void anHttpActionTakesTheSameClientKeysAsAWebhook() {
        var actions = PlaybookLoader.parseActions("/etc/tend/actions.yaml", """
                actions:
                  rotate-certificate:
                    http:
                      url: https://certs.larkspur.example/v1/clusters/{cluster}/rotations
                      bearer-token-file: certs.token
                      client-cert: /etc/tend/tend.pem
                      client-key: /etc/tend/tend.key
                """);
        HttpAction a = (HttpAction) actions.get(Id.of("rotate-certificate")).orElseThrow();
        assertThat(a.client().bearerTokenFile()).isEqualTo(Path.of("/etc/tend/certs.token"));
        assertThat(a.client().hasTls()).isTrue();
        assertThat(TestDir.problems(() -> PlaybookLoader.parseActions("actions.yaml", """
                actions:
                  rotate-certificate:
                    http: { url: "https://certs.larkspur.example/", client-cert: /etc/tend/tend.pem }
                """))).extracting(Problem::toString).containsExactly(
                "actions.yaml:3:66: action rotate-certificate.http: client-cert and client-key go together (mutual TLS needs the"
                        + " certificate and its key)");
    }
}
