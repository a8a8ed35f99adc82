package dev.tend.cli;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.tend.api.ApiJson;
import dev.tend.api.view.ApprovalView;
import dev.tend.api.view.BrakeView;
import dev.tend.api.view.ExclusionView;
import dev.tend.shared.TendException;
import dev.tend.shared.time.InstantText;

import java.io.PrintWriter;
import java.time.Instant;
import java.util.List;

/** Text and JSON renderings shared by the operator commands. */
final class Render {
    private Render() {
    }

    static void json(PrintWriter out, Object value) {
        try {
            out.println(ApiJson.MAPPER.copy().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(value));
        } catch (JsonProcessingException e) {
            throw new TendException("cannot write JSON: " + e.getMessage(), e);
        }
    }

    static String target(String cluster, String node) {
        return node == null ? cluster : cluster + "/" + node;
    }

    /** A time to the second, RFC 3339 in UTC ({@code 2027-03-14T02:17:05Z}): what a table column has room for. */
    static String time(Instant t) {
        return t == null ? "-" : InstantText.toSecond(t);
    }

    static void approvals(PrintWriter out, List<ApprovalView> list) {
        if (list.isEmpty()) {
            out.println("no approvals");
            return;
        }
        out.printf("%-8s %-28s %-18s %-10s %-21s %-21s %s%n", "RUN", "PLAYBOOK", "TARGET", "STATE", "REQUESTED", "EXPIRES", "REASONS");
        for (ApprovalView a : list) {
            out.printf("%-8s %-28s %-18s %-10s %-21s %-21s %s%n", a.run(), a.playbook(), target(a.cluster(), a.node()), a.state(),
                    time(a.requestedAt()), time(a.expiresAt()), String.join(",", a.reasons()));
        }
    }

    static void exclusions(PrintWriter out, List<ExclusionView> list) {
        if (list.isEmpty()) {
            out.println("no exclusions");
            return;
        }
        out.printf("%-18s %-18s %-21s %-8s %s%n", "TARGET", "OWNER", "UNTIL", "ACTIVE", "REASON");
        for (ExclusionView x : list) {
            out.printf("%-18s %-18s %-21s %-8s %s%n", target(x.cluster(), x.node()), x.owner(),
                    x.until() == null ? "until removed" : time(x.until()), x.active() ? "yes" : "lapsed", x.reason());
        }
    }

    static String brake(BrakeView b) {
        if (!b.engaged()) return "fleet brake released";
        return "fleet brake ENGAGED since " + time(b.since()) + " by " + b.by() + (b.manual() ? " (by hand: releases only by hand)" : "")
                + ": " + b.reason();
    }
}
