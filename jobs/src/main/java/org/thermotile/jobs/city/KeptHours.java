package org.thermotile.jobs.city;

import java.time.Instant;
import java.util.List;
import java.util.TreeSet;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.errors.UserInputException;

/**
 * The hours whose surface-temperature grids a run keeps: every hour of {@code outputs.hourly_days}
 * and, for each image of {@code observations:}, only the counted hours that bracket its acquisition
 * time (one hour when it falls on the hour, else the hour before and the hour after). The
 * comparison interpolates linearly between them, so no other hour of the acquisition day is held.
 */
final class KeptHours {
    private KeptHours() {}

    /**
     * Forcing hour indices to keep, ascending, without repeats.
     *
     * @param epochSecond each forcing hour's time [s since 1970, UTC]
     * @param firstSample first counted hour index
     * @param endSample   one past the last counted hour index
     * @param dayHours    the hours of {@code outputs.hourly_days} (indices)
     * @param images      the run file's observations
     * @throws UserInputException when an acquisition time has no counted hour on either side
     */
    static int[] of(long[] epochSecond, int firstSample, int endSample, List<Integer> dayHours,
            List<RunFile.Observation> images) {
        TreeSet<Integer> kept = new TreeSet<>(dayHours);
        for (RunFile.Observation o : images) {
            long t = o.time().getEpochSecond();
            int lo = -1;
            int hi = -1;
            for (int h = firstSample; h < endSample; h++) {
                if (epochSecond[h] <= t) {
                    lo = h;
                }
                if (epochSecond[h] >= t && hi < 0) {
                    hi = h;
                }
            }
            if (lo < 0 || hi < 0) {
                throw new UserInputException(o.where() + ": the acquisition time " + o.time()
                        + " is outside the run's counted hours " + Instant.ofEpochSecond(epochSecond[firstSample])
                        + " … " + Instant.ofEpochSecond(epochSecond[endSample - 1])
                        + "; fix: correct the time (UTC, or with its offset), or widen the period to hold it");
            }
            kept.add(lo);
            kept.add(hi);
        }
        return kept.stream().mapToInt(Integer::intValue).toArray();
    }
}
