package lariat.report.demo;

import java.util.List;

/** The whole demo report: a title, a one-paragraph description of the run, and the stations. */
public final class DemoReport {

    private final String title;
    private final String description;
    private final List<StationReport> stations;

    private DemoReport(String title, String description, List<StationReport> stations) {
        this.title = Checks.name(title, "title");
        if (description == null) {
            throw new IllegalArgumentException("description must not be null");
        }
        this.description = description;
        this.stations = Checks.list(stations, "stations");
        if (this.stations.stream().map(StationReport::station).distinct().count() != this.stations.size()) {
            throw new IllegalArgumentException("stations must have distinct names, got "
                    + this.stations.stream().map(StationReport::station).toList());
        }
    }

    public static DemoReport of(String title, String description, List<StationReport> stations) {
        return new DemoReport(title, description, stations);
    }

    public String title() {
        return title;
    }

    public String description() {
        return description;
    }

    public List<StationReport> stations() {
        return stations;
    }
}
