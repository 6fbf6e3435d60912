package org.thermotile.jobs.report;

import org.thermotile.jobs.errors.UserInputException;

/**
 * A run folder the report cannot be made from (a missing manifest, a damaged table, a malformed
 * outline file): the message names the file, the place and the fix. The command line exits with
 * status 2 on it, as for other bad input.
 */
public class ReportException extends UserInputException {
    private static final long serialVersionUID = 1L;

    public ReportException(String message) {
        super(message);
    }

    public ReportException(String message, Throwable cause) {
        super(message, cause);
    }
}
