package dev.tend.http;

import dev.tend.shared.TendException;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermission;
import java.util.Set;

/** Checks that a secret file (a private key, a token, credentials) can be read and is not readable by others. */
public final class PrivateFiles {
    private PrivateFiles() {
    }

    /**
     * Throws {@link TendException} naming {@code what} and the file when it is missing,
     * unreadable, or readable or writable by users other than its owner and group members
     * ("others"). On a file system without POSIX permissions only readability is checked.
     */
    public static void check(Path file, String what) {
        if (!Files.isRegularFile(file)) throw new TendException(what + " " + file + " does not exist or is not a file");
        if (!Files.isReadable(file)) throw new TendException(what + " " + file + " cannot be read by tend");
        Set<PosixFilePermission> perms;
        try {
            perms = Files.getPosixFilePermissions(file);
        } catch (UnsupportedOperationException e) {
            return;
        } catch (IOException e) {
            throw new TendException("cannot read the permissions of " + what + " " + file + ": " + e.getMessage(), e);
        }
        if (perms.contains(PosixFilePermission.OTHERS_READ) || perms.contains(PosixFilePermission.OTHERS_WRITE)) {
            throw new TendException(what + " " + file + " can be read or written by any user of this machine; tend refuses"
                    + " to use it. Make it private: chmod 600 " + file);
        }
    }
}
