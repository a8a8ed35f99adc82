package dev.tend.handover;

import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

import javax.xml.parsers.DocumentBuilderFactory;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static dev.tend.handover.NightShift.SINCE;
import static dev.tend.handover.NightShift.UNTIL;
import static dev.tend.handover.NightShift.VENDOR_NOTE;
import static dev.tend.handover.NightShift.at;
import static org.assertj.core.api.Assertions.assertThat;

/** The text, CSV and HTML renderings of the scripted night's report. */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class HandoverRenderingTest {
    private NightShift night;
    private HandoverReport report;

    @BeforeAll
    void playTheNight(@TempDir Path dir) throws Exception {
        night = NightShift.overnight(dir.resolve("tend.db"));
        report = night.report(SINCE, UNTIL);
    }

    @AfterAll
    void closeTheStore() {
        night.close();
    }

    @Test
    void textFitsOneScreenWithHeadlineFirstThenAttentionThenBreakdowns() {
        String text = HandoverText.render(report);

        assertThat(text.lines().count()).as(text).isLessThanOrEqualTo(40);
        assertThat(text).contains("Runs       4 started, 2 succeeded, 1 failed, 1 cancelled, 0 shadowed",
                "Held       1 held, 1 denied (distinct candidates)", "Approvals  2 asked, 1 pending, 1 lapsed",
                "verify ok (entries " + report.ledger().verifiedFrom() + " on; `tend audit verify` for all), head "
                        + report.ledger().headHash());
        assertThat(inOrder(text, "Runs ", "Ledger ", "Needs attention", "approval pending", "needs a person", "fleet brake",
                "By playbook", "Held and denied by reason code", "Nodes remediated", "Fleet brake periods",
                "Approvals lapsed")).isTrue();
        assertThat(text).contains("  ! approval pending  " + night.runOn("fares-9") + "  replace-silent-node  fares-9/n1");
        assertThat(text).contains("  ! needs a person    " + night.runOn("fares-6") + "  replace-silent-node  fares-6/n1  step drain:");
        assertThat(text).contains("  replace-silent-node (2): fares-2/n1 (drain-node, replace-node), fares-3/n2 (drain-node, replace-node)");
        assertThat(text).contains("  2027-03-14T02:00:00Z to 02:30:00Z (30m)  engaged by ana: drill; released by ben: drill over");
    }

    @Test
    void textSaysSoWhenNothingNeedsAttention() {
        String text = HandoverText.render(night.report(at("21:00"), SINCE));

        assertThat(text).contains("Nothing needs attention.").doesNotContain("Needs attention");
        assertThat(text).contains("Runs       1 started, 1 succeeded, 0 failed");
    }

    @Test
    void csvHasOneRowPerRunThenTheSummaryTable() {
        String csv = HandoverCsv.render(report);

        // RFC 4180 section 2: records end with CRLF
        assertThat(csv.replace("\r\n", "")).doesNotContain("\n");
        String[] tables = csv.split("\r\n\r\n", -1);
        assertThat(tables).hasSize(2);
        List<List<String>> runs = parse(tables[0]);
        assertThat(runs.get(0)).containsExactly("run", "playbook", "cluster", "node", "created_at", "started_at", "ended_at",
                "state", "note", "actions");
        assertThat(runs).hasSize(1 + report.runs().size());
        assertThat(runs.subList(1, runs.size())).extracting(row -> row.get(2) + "/" + row.get(3) + " " + row.get(7)).containsExactly(
                "fares-2/n1 succeeded", "fares-10/n1 cancelled", "fares-3/n2 succeeded", "fares-4/n1 failed",
                "fares-6/n1 needs-human", "fares-9/n1 awaiting-approval");
        assertThat(runs.get(1).get(9)).isEqualTo("drain-node;replace-node");
        List<List<String>> summary = parse(tables[1]);
        assertThat(summary.get(0)).containsExactly("metric", "playbook", "reason_code", "value");
        assertThat(summary).contains(List.of("runs_started", "", "", "4"), List.of("runs_failed", "", "", "1"),
                List.of("held", "", "fleet-brake", "1"), List.of("denied", "", "excluded", "1"),
                List.of("runs_succeeded", "replace-silent-node", "", "2"), List.of("approvals_pending", "", "", "1"),
                List.of("brake_engaged_at_until", "", "", "true"), List.of("ledger_verified", "", "", "true"),
                List.of("ledger_head", "", "", report.ledger().headHash()));
    }

    @ParameterizedTest(name = "[{index}] {0}")
    @CsvSource(delimiter = '|', quoteCharacter = '\'', value = {
            // RFC 4180 section 2, rules 6 and 7
            "plain text         | plain text",
            "a,b                | \"a,b\"",
            "say \"hi\"         | \"say \"\"hi\"\"\"",
    })
    void csvFieldsAreQuotedOnlyWhenTheyMustBe(String field, String written) {
        assertThat(HandoverCsv.field(field)).isEqualTo(written);
    }

    @Test
    void csvFieldsWithALineBreakAreQuoted() {
        // RFC 4180 section 2, rule 6
        assertThat(HandoverCsv.field("two\nlines")).isEqualTo("\"two\nlines\"");
        assertThat(HandoverCsv.field("two\r\nlines")).isEqualTo("\"two\r\nlines\"");
        assertThat(HandoverCsv.field(null)).isEmpty();
    }

    @Test
    void htmlIsWellFormedAndHoldsTheTimelineWithRunsBrakePeriodsAndApprovals() throws Exception {
        Document doc = xml(HandoverHtml.render(report));

        Element svg = timeline(doc);
        assertThat(titled(svg, "rect", "run ")).hasSize(report.runs().size());
        assertThat(titled(svg, "rect", "brake")).hasSize(2);
        assertThat(titled(svg, "polygon", "ask ")).hasSize(2);
        assertThat(titled(svg, "circle", "settled ")).as("the lapse of fares-10's approval").hasSize(1);
        List<String> labels = new ArrayList<>();
        NodeList texts = svg.getElementsByTagName("text");
        for (int i = 0; i < texts.getLength(); i++) {
            Element t = (Element) texts.item(i);
            if (t.getAttribute("class").equals("label")) labels.add(t.getTextContent());
        }
        assertThat(labels).containsExactly("fares-2", "fares-3", "fares-4", "fares-6", "fares-9", "fares-10");
    }

    @Test
    void htmlRefersToNothingOutsideThePage() {
        String html = HandoverHtml.render(report);

        assertThat(html).contains(VENDOR_NOTE);
        // the only address in the page is the one an operator typed into the brake reason
        String withoutOperatorText = html.replace(VENDOR_NOTE, "");
        assertThat(withoutOperatorText).doesNotContain("http://", "https://", "src=", "href=", "<script", "<link", "url(", "@import");
    }

    @Test
    void htmlEscapesLedgerText(@TempDir Path dir) throws Exception {
        try (NightShift n = new NightShift(dir.resolve("tend.db"), SINCE)) {
            n.engageBrake("ana", "<b>disk</b> & \"racks\" 'z-b'");
            n.advance(java.time.Duration.ofHours(1));
            String html = HandoverHtml.render(n.report(SINCE, at("23:00")));

            assertThat(html).contains("&lt;b&gt;disk&lt;/b&gt; &amp; &quot;racks&quot; &#39;z-b&#39;").doesNotContain("<b>disk");
            assertThat(timeline(xml(html))).isNotNull();
        }
    }

    @ParameterizedTest(name = "[{index}] {0} before {1}")
    @CsvSource({"fares-2, fares-10", "fares-9, fares-10", "dispatch-1, fares-1", "tickets-3, tickets-12", "z-a, z-a1",
            "fares-02, fares-3"})
    void timelineRowsAreInNaturalOrder(String first, String second) {
        assertThat(TimelineSvg.naturalOrder(first, second)).isNegative();
        assertThat(TimelineSvg.naturalOrder(second, first)).isPositive();
    }

    @Test
    void theHtmlTimelineZoomsToWhereActivityIsAndKeepsEveryRunWideEnoughToPointAt(@TempDir Path dir) throws Exception {
        try (NightShift n = new NightShift(dir.resolve("tend.db"), SINCE)) {
            n.advanceTo(at("23:00"));
            n.silent("fares-2", "n1");
            n.advanceTo(at("23:30"));
            // an 11-hour period with one 5-minute run in it
            HandoverReport r = n.report(SINCE, at("09:00"));
            RunLine run = r.runs().get(0);
            ReportPeriod w = TimelineSvg.window(r);
            assertThat(w.since()).isAfter(SINCE).isBeforeOrEqualTo(run.createdAt());
            assertThat(w.until()).isAfterOrEqualTo(run.endedAt());
            assertThat(w.length()).isLessThan(java.time.Duration.ofHours(1)).isGreaterThanOrEqualTo(TimelineSvg.MIN_WINDOW);
            String html = HandoverHtml.render(r);
            assertThat(html).contains("Zoomed to where activity is: ").contains("of the 11h period");
            Element bar = titled(timeline(xml(html)), "rect", "run ").get(0);
            assertThat(Double.parseDouble(bar.getAttribute("width"))).as("the 5-minute run in the zoomed axis").isGreaterThan(200);
            assertThat(bar.getElementsByTagName("title").item(0).getTextContent()).as("its label on hover")
                    .contains(run.run()).contains("replace-silent-node").contains("fares-2/n1");
        }
        try (NightShift quiet = new NightShift(dir.resolve("quiet.db"), SINCE)) {
            quiet.advanceTo(at("23:00"));
            HandoverReport r = quiet.report(SINCE, at("23:00"));
            assertThat(TimelineSvg.window(r)).as("nothing happened: the whole period").isEqualTo(r.period());
        }
    }

    @Test
    void everyRunIsDrawnAtLeastMinRunWideAndTheLegendIsAnHtmlListOutsideTheChart() throws Exception {
        Document doc = xml(HandoverHtml.render(report));
        Element svg = timeline(doc);
        for (Element bar : titled(svg, "rect", "run ")) {
            assertThat(Double.parseDouble(bar.getAttribute("width"))).isGreaterThanOrEqualTo(TimelineSvg.MIN_RUN);
        }
        NodeList texts = svg.getElementsByTagName("text");
        for (int i = 0; i < texts.getLength(); i++) {
            assertThat(((Element) texts.item(i)).getAttribute("class")).as("no legend text drawn at guessed positions").isNotEqualTo("legend");
        }
        NodeList lists = doc.getElementsByTagName("ul");
        List<String> legend = new ArrayList<>();
        for (int i = 0; i < lists.getLength(); i++) {
            Element ul = (Element) lists.item(i);
            if (!ul.getAttribute("class").equals("legend")) continue;
            NodeList items = ul.getElementsByTagName("li");
            for (int j = 0; j < items.getLength(); j++) legend.add(items.item(j).getTextContent().strip());
        }
        assertThat(legend).contains("succeeded", "failed", "paused by the fleet brake", "fleet brake engaged", "approval pending");
    }

    /** The page's timeline chart (the legend's colour swatches are small SVGs of their own). */
    static Element timeline(Document doc) {
        NodeList svgs = doc.getElementsByTagName("svg");
        Element found = null;
        for (int i = 0; i < svgs.getLength(); i++) {
            Element e = (Element) svgs.item(i);
            if (e.getAttribute("class").equals("timeline")) {
                assertThat(found).as("one timeline").isNull();
                found = e;
            }
        }
        assertThat(found).as("the timeline").isNotNull();
        return found;
    }

    private static boolean inOrder(String text, String... parts) {
        int from = 0;
        for (String p : parts) {
            int i = text.indexOf(p, from);
            if (i < 0) return false;
            from = i + p.length();
        }
        return true;
    }

    private static List<Element> titled(Element root, String tag, String classPrefix) {
        List<Element> out = new ArrayList<>();
        NodeList list = root.getElementsByTagName(tag);
        for (int i = 0; i < list.getLength(); i++) {
            Element e = (Element) list.item(i);
            if ((e.getAttribute("class") + " ").startsWith(classPrefix) && e.getElementsByTagName("title").getLength() == 1) out.add(e);
        }
        return out;
    }

    static Document xml(String html) throws Exception {
        DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
        f.setFeature("http://apache.org/xml/features/nonvalidating/load-external-dtd", false);
        f.setExpandEntityReferences(false);
        return f.newDocumentBuilder().parse(new ByteArrayInputStream(html.getBytes(StandardCharsets.UTF_8)));
    }

    /** A CSV table as RFC 4180 section 2 defines it (CRLF records, quoted fields with doubled quotes). */
    static List<List<String>> parse(String table) {
        List<List<String>> rows = new ArrayList<>();
        List<String> row = new ArrayList<>();
        StringBuilder field = new StringBuilder();
        boolean quoted = false;
        for (int i = 0; i < table.length(); i++) {
            char c = table.charAt(i);
            if (quoted) {
                if (c == '"' && i + 1 < table.length() && table.charAt(i + 1) == '"') {
                    field.append('"');
                    i++;
                } else if (c == '"') {
                    quoted = false;
                } else {
                    field.append(c);
                }
            } else if (c == '"') {
                quoted = true;
            } else if (c == ',') {
                row.add(field.toString());
                field.setLength(0);
            } else if (c == '\r' && i + 1 < table.length() && table.charAt(i + 1) == '\n') {
                row.add(field.toString());
                field.setLength(0);
                rows.add(row);
                row = new ArrayList<>();
                i++;
            } else {
                field.append(c);
            }
        }
        if (field.length() > 0 || !row.isEmpty()) {
            row.add(field.toString());
            rows.add(row);
        }
        return rows;
    }
}
