package lariat.report.demo;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * Scores a station's alerts against its injected changes. A change counts as detected by the
 * first alert at or after it, and before the station's next change, that reports the same
 * channel with the same kind (entered, left, flipped); the delay is the event time between the
 * two. Alerts that detect no change are "other alerts" (on a station without changes, false alerts).
 */
public final class Detection {

    private final ChangeMark change;
    private final AlertMark alert;

    private Detection(ChangeMark change, AlertMark alert) {
        this.change = change;
        this.alert = alert;
    }

    /** One detection per change of the station, in change order. */
    public static List<Detection> of(StationReport s) {
        List<Detection> out = new ArrayList<>();
        List<ChangeMark> changes = s.changes();
        for (int i = 0; i < changes.size(); i++) {
            ChangeMark c = changes.get(i);
            long until = i + 1 < changes.size() ? changes.get(i + 1).timeMs() : Long.MAX_VALUE;
            AlertMark found = null;
            for (AlertMark a : s.alerts()) {
                if (a.timeMs() >= c.timeMs() && a.timeMs() < until && a.reports(c)) {
                    found = a;
                    break;
                }
            }
            out.add(new Detection(c, found));
        }
        return List.copyOf(out);
    }

    /** Alerts of the station that detect none of its changes. */
    public static int otherAlerts(StationReport s) {
        Set<AlertMark> used = new HashSet<>();
        for (Detection d : of(s)) {
            if (d.alert != null) {
                used.add(d.alert);
            }
        }
        return (int) s.alerts().stream().filter(a -> !used.contains(a)).count();
    }

    public ChangeMark change() {
        return change;
    }

    public boolean detected() {
        return alert != null;
    }

    /** The detecting alert, or null. */
    public AlertMark alert() {
        return alert;
    }

    /** Event time from the change to its detection, ms; -1 when not detected. */
    public long delayMs() {
        return alert == null ? -1 : alert.timeMs() - change.timeMs();
    }
}
