package org.thermotile.jobs.errors;

/**
 * A problem with what the user gave (a file, an option, a value): the message names the place
 * and the fix, and the command exits with status 2 without a stack trace.
 */
public class UserInputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public UserInputException(String message) {
        super(message);
    }

    public UserInputException(String message, Throwable cause) {
        super(message, cause);
    }
}
