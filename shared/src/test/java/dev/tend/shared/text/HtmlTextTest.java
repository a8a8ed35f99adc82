package dev.tend.shared.text;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

import javax.xml.parsers.DocumentBuilderFactory;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;

import static org.assertj.core.api.Assertions.assertThat;

class HtmlTextTest {
    @ParameterizedTest(name = "{0} -> {1}")
    @CsvSource(delimiter = '|', value = {
            "fares-3|fares-3",
            "a < b && c > d|a &lt; b &amp;&amp; c &gt; d",
            "say \"no\"|say &quot;no&quot;",
            "it's|it&#39;s",
    })
    void escapesTheFiveMarkupCharacters(String text, String escaped) {
        assertThat(HtmlText.escape(text)).isEqualTo(escaped);
    }

    @Test
    void nullIsEmptyAndControlCharactersOtherThanLineBreaksAndTabBecomeQuestionMarks() {
        assertThat(HtmlText.escape(null)).isEmpty();
        assertThat(HtmlText.escape("a\tb\nc\rd\u0007e\u0000")).isEqualTo("a\tb\nc\rd?e?");
    }

    @Test
    void escapedTextReadsBackUnchangedThroughTheJdksXmlParser() throws Exception {
        // the JDK's XML 1.0 parser (a general-purpose reference implementation) reads the escaped
        // text, in content and in an attribute, back as the original
        String text = "<script>alert('x & \"y\"')</script>";
        String doc = "<p title=\"" + HtmlText.escape(text) + "\">" + HtmlText.escape(text) + "</p>";
        var root = DocumentBuilderFactory.newInstance().newDocumentBuilder()
                .parse(new ByteArrayInputStream(doc.getBytes(StandardCharsets.UTF_8))).getDocumentElement();
        assertThat(root.getTextContent()).isEqualTo(text);
        assertThat(root.getAttribute("title")).isEqualTo(text);
    }
}
