package dev.tend.page;

import dev.tend.http.OutgoingHttp;
import dev.tend.http.PrivateFiles;
import dev.tend.playbooks.EmailChannel;
import dev.tend.shared.TendException;
import jakarta.mail.Authenticator;
import jakarta.mail.MessagingException;
import jakarta.mail.PasswordAuthentication;
import jakarta.mail.SendFailedException;
import jakarta.mail.Session;
import jakarta.mail.Transport;
import jakarta.mail.internet.InternetAddress;
import jakarta.mail.internet.MimeMessage;
import org.eclipse.angus.mail.smtp.SMTPAddressFailedException;
import org.eclipse.angus.mail.smtp.SMTPSendFailedException;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.util.Date;
import java.util.Properties;

/**
 * Mails a page as plain text over SMTP (Jakarta Mail through Eclipse Angus), with STARTTLS
 * (required, not merely tried), TLS from the first byte, or none; the server's certificate must
 * name the host and chain to the JDK's trust store or to the channel's {@code ca-bundle}. The message id is made
 * from the page id, so a mail system can drop a repeat; the header {@code X-Tend-Page} holds
 * the page id as well. The server's acceptance is delivery; a 5xx reply (a refused recipient
 * or sender) refuses the page; anything else is tried again later.
 */
public final class EmailSender implements PageSender {
    private final EmailChannel channel;
    private final Session session;

    public EmailSender(EmailChannel channel) {
        this.channel = channel;
        Properties p = new Properties();
        String proto = channel.security() == EmailChannel.Security.TLS ? "smtps" : "smtp";
        p.put("mail.transport.protocol", proto);
        // Transport.send picks the transport by the recipients' address type, which is plain smtp unless told
        p.put("mail.transport.protocol.rfc822", proto);
        p.put("mail." + proto + ".host", channel.host());
        p.put("mail." + proto + ".port", String.valueOf(channel.port()));
        String ms = String.valueOf(channel.timeout().toMillis());
        p.put("mail." + proto + ".connectiontimeout", ms);
        p.put("mail." + proto + ".timeout", ms);
        p.put("mail." + proto + ".writetimeout", ms);
        if (channel.security() == EmailChannel.Security.STARTTLS) {
            p.put("mail.smtp.starttls.enable", "true");
            p.put("mail.smtp.starttls.required", "true");
        }
        if (channel.security() != EmailChannel.Security.NONE) p.put("mail." + proto + ".ssl.checkserveridentity", "true");
        if (channel.caBundle() != null) {
            // trust the bundle's certificates instead of the JDK's, for TLS from the first byte and for STARTTLS alike
            try {
                javax.net.ssl.SSLContext tls = javax.net.ssl.SSLContext.getInstance("TLS");
                tls.init(null, OutgoingHttp.trust(channel.caBundle(), "ca-bundle").getTrustManagers(), null);
                p.put("mail." + proto + ".ssl.socketFactory", tls.getSocketFactory());
            } catch (java.security.GeneralSecurityException e) {
                throw new TendException("channel " + channel.name() + ": cannot use ca-bundle " + channel.caBundle() + ": " + e.getMessage(), e);
            }
        }
        Authenticator auth = null;
        if (channel.credentialsFile() != null) {
            PrivateFiles.check(channel.credentialsFile(), "credentials-file");
            p.put("mail." + proto + ".auth", "true");
            auth = new Authenticator() {
                @Override
                protected PasswordAuthentication getPasswordAuthentication() {
                    return credentials();
                }
            };
            credentials();
        }
        this.session = Session.getInstance(p, auth);
    }

    /** Read at every login, so that changed credentials are used without a restart. */
    private PasswordAuthentication credentials() {
        try {
            String line = Files.readString(channel.credentialsFile(), StandardCharsets.UTF_8).lines().findFirst().orElse("");
            int colon = line.indexOf(':');
            if (colon < 1) throw new TendException("credentials-file " + channel.credentialsFile() + " must hold user:password on its first line");
            return new PasswordAuthentication(line.substring(0, colon), line.substring(colon + 1));
        } catch (IOException e) {
            throw new TendException("cannot read credentials-file " + channel.credentialsFile() + ": " + e.getMessage(), e);
        }
    }

    @Override
    public String kind() {
        return "email";
    }

    @Override
    public Answer send(Page page) {
        try {
            MimeMessage m = new MimeMessage(session) {
                @Override
                protected void updateMessageID() throws MessagingException {
                    setHeader("Message-ID", "<" + page.id().replaceAll("[^A-Za-z0-9._-]", ".") + "@tend.invalid>");
                }
            };
            m.setFrom(new InternetAddress(channel.from()));
            for (String to : channel.to()) m.addRecipient(jakarta.mail.Message.RecipientType.TO, new InternetAddress(to));
            m.setSubject(oneLine(channel.subject().render(page.placeholders())), "UTF-8");
            m.setSentDate(new Date());
            m.setHeader("X-Tend-Page", page.id());
            m.setText(page.toText(), "UTF-8");
            Transport.send(m);
            return Answer.accepted("accepted by " + channel.host() + ":" + channel.port() + " for " + String.join(", ", channel.to()));
        } catch (SendFailedException e) {
            return refusedOrRetry(e);
        } catch (MessagingException | RuntimeException e) {
            return Answer.retry("could not send through " + channel.host() + ":" + channel.port() + ": " + describe(e));
        }
    }

    private Answer refusedOrRetry(SendFailedException e) {
        int code = 0;
        for (Exception x = e; x != null; x = x instanceof MessagingException me ? me.getNextException() : null) {
            if (x instanceof SMTPAddressFailedException a) code = Math.max(code, a.getReturnCode());
            else if (x instanceof SMTPSendFailedException s) code = Math.max(code, s.getReturnCode());
        }
        String text = describe(e);
        if (e.getInvalidAddresses() != null && e.getInvalidAddresses().length > 0) {
            text += " (refused: " + String.join(", ", java.util.Arrays.stream(e.getInvalidAddresses()).map(String::valueOf).toList()) + ")";
        }
        return code >= 500 ? Answer.refused(text) : Answer.retry(text);
    }

    private static String describe(Exception e) {
        StringBuilder b = new StringBuilder();
        for (Exception x = e; x != null; x = x instanceof MessagingException me ? me.getNextException() : null) {
            if (b.length() > 0) b.append("; ");
            b.append(String.valueOf(x.getMessage()).strip());
            if (b.length() > 600) break;
        }
        return b.toString();
    }

    private static String oneLine(String s) {
        String t = s.replaceAll("[\\r\\n]+", " ");
        return t.length() > 200 ? t.substring(0, 200) : t;
    }
}
