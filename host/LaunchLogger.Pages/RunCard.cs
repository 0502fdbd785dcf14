using System.Globalization;
using System.Text;
using LaunchLogger.Archive.Records;
using LaunchLogger.Cli.Output;
using LaunchLogger.Decoding.Braking;
using LaunchLogger.Decoding.Reporting;
using static LaunchLogger.Pages.Cells;

namespace LaunchLogger.Pages;

/// <summary>One run's card: who and where, the verdict in words, both timing conventions side by
/// side, the plots, the stop and the grip bound, the corrections, the box and its calibration.</summary>
public static class RunCard
{
    /// <summary>A page holding one card.</summary>
    public static string Page(CardInput card)
    {
        ArgumentNullException.ThrowIfNull(card);
        var html = new StringBuilder(16384);
        Append(html, card);
        return HtmlPage.Document(Title(card), html.ToString(), FootNote(card.ToolVersion));
    }

    /// <summary>The page title of a card.</summary>
    public static string Title(CardInput card)
    {
        ArgumentNullException.ThrowIfNull(card);
        string who = card.Filed is { } f ? string.Join(" · ", new[] { f.Driver, f.Car, f.Event }.Where(s => !string.IsNullOrWhiteSpace(s))) : Path.GetFileName(card.Run.Source);
        return $"Run card: run {card.Run.Run}" + (who.Length > 0 ? " — " + who : "");
    }

    /// <summary>The footer line of every page.</summary>
    public static string FootNote(string toolVersion) =>
        $"Made by launchlogger {toolVersion}. Figures are the report's (launchlogger report --json); ± is one standard deviation.";

    /// <summary>Appends the card as an <c>article</c>.</summary>
    public static void Append(StringBuilder html, CardInput card)
    {
        ArgumentNullException.ThrowIfNull(html);
        ArgumentNullException.ThrowIfNull(card);
        RunReport run = card.Run;
        DisplayUnits units = card.Units;
        string level = run.Verdict?.Level ?? "unjudged";
        html.Append("<article class=\"card\" data-run=\"").Append(run.Run.ToString(CultureInfo.InvariantCulture))
            .Append("\" data-index=\"").Append(run.Index.ToString(CultureInfo.InvariantCulture)).Append('"');
        if (card.Filed is { } idFacts)
        {
            html.Append(" data-archive-run=\"").Append(idFacts.RunId.ToString(CultureInfo.InvariantCulture)).Append('"');
        }

        html.Append(" data-verdict=\"").Append(HtmlPage.Encode(level)).Append("\">\n");
        Identity(html, card, level);
        Verdict(html, run);
        Start(html, run, units);
        Conventions(html, run, units);
        Plots(html, card.Plots);
        Motion(html, run, units);
        Stop(html, run, card.TractionBound, card.BoundNote, units);
        Corrections(html, run, card.Weather, card.Filed, units);
        Box(html, run, card.Filed, units);
        Notes(html, run);
        html.Append("<p class=\"note\">Source: ").Append(HtmlPage.Encode(run.Source))
            .Append(card.Filed?.AnalysedAt is { } at ? " · analysed " + HtmlPage.Encode(at) : "")
            .Append(" · launchlogger ").Append(HtmlPage.Encode(card.ToolVersion)).Append("</p>\n");
        html.Append("</article>\n");
    }

    /// <summary>What a verdict level means, in words.</summary>
    public static string VerdictWords(string level) => level switch
    {
        "valid" => "valid: the figures can be quoted",
        "doubtful" => "doubtful: quote the figures only with the reasons below",
        "invalid" => "invalid: do not quote these figures",
        "failed" => "not analysed: the run could not be rebuilt",
        _ => "not judged",
    };

    private static void Identity(StringBuilder html, CardInput card, string level)
    {
        RunReport run = card.Run;
        html.Append("<header class=\"ident\"><div><h1>Run ").Append(run.Run.ToString(CultureInfo.InvariantCulture));
        if (card.Filed is { } f)
        {
            html.Append(" <span class=\"who\">(archive run ").Append(f.RunId.ToString(CultureInfo.InvariantCulture)).Append(")</span>");
        }

        html.Append("</h1>\n");
        if (card.Filed is { } facts)
        {
            string who = string.Join(" · ", new[]
            {
                facts.Driver is null ? null : HtmlPage.Encode(facts.Driver) + (facts.Club is null ? "" : " (" + HtmlPage.Encode(facts.Club) + ")"),
                facts.Car is null ? null : "car " + HtmlPage.Encode(facts.Car),
                facts.Class is null ? null : "class " + HtmlPage.Encode(facts.Class),
            }.Where(s => s is not null));
            string where = string.Join(" · ", new[] { facts.Event, facts.Date, facts.Venue }.Where(s => !string.IsNullOrWhiteSpace(s)).Select(HtmlPage.Encode));
            html.Append("<p class=\"who\" data-role=\"who\">").Append(who.Length > 0 ? who : "not assigned to a driver or car").Append("</p>\n");
            if (where.Length > 0)
            {
                html.Append("<p class=\"who\" data-role=\"where\">").Append(where).Append("</p>\n");
            }

            if (facts.Standing != "counted")
            {
                html.Append("<p><strong>Not counted: ").Append(HtmlPage.Encode(facts.Standing)).Append("</strong> — ").Append(HtmlPage.Encode(facts.StandingReason)).Append("</p>\n");
            }
        }
        else
        {
            html.Append("<p class=\"who\">").Append(HtmlPage.Encode(run.Source)).Append("</p>\n");
        }

        html.Append("</div><div class=\"badge ").Append(HtmlPage.Encode(level)).Append("\" data-role=\"verdict\">").Append(HtmlPage.Encode(level)).Append("</div></header>\n");
    }

    private static void Verdict(StringBuilder html, RunReport run)
    {
        html.Append("<h2>Verdict</h2>\n<p>This run is ").Append(HtmlPage.Encode(VerdictWords(run.Verdict?.Level ?? "unjudged"))).Append(".</p>\n");
        if (run.Verdict is { Reasons.Count: > 0 } verdict)
        {
            html.Append("<ul class=\"reasons\">\n");
            foreach (VerdictReasonReport reason in verdict.Reasons)
            {
                html.Append("<li class=\"").Append(HtmlPage.Encode(reason.Level)).Append("\"><strong>").Append(HtmlPage.Encode(reason.Level)).Append(":</strong> ")
                    .Append(HtmlPage.Encode(reason.Text)).Append(" <span class=\"code\">").Append(HtmlPage.Encode(reason.Code)).Append("</span></li>\n");
            }

            html.Append("</ul>\n");
        }
        else if (run.Verdict is not null)
        {
            html.Append("<p class=\"note\">Nothing was found that casts doubt on the figures.</p>\n");
        }
    }

    private static void Start(StringBuilder html, RunReport run, DisplayUnits units)
    {
        html.Append("<h2>The start</h2>\n<dl class=\"facts\">\n");
        Fact(html, "Start", run.Staged
            ? "from standstill after staging"
            : "rolling: the run opened with the car already moving, so it has no standing-start figure");
        Fact(html, "Rebuilt from", HtmlPage.Encode(run.Method));
        Fact(html, "First motion", run.FirstMotionS is { } firstMotion && !double.IsFinite(firstMotion)
            ? "not found"
            : Seconds("first_motion_s", run.FirstMotionS, "first_motion_uncertainty_s", run.FirstMotionUncertaintyS) + " on the input's clock");
        RolloutReport r = run.Rollout;
        string rollout = r.AfterFirstMotionS is { } after
            ? Seconds("rollout/after_first_motion_s", after, "rollout/after_first_motion_uncertainty_s", r.AfterFirstMotionUncertaintyS) + " after first motion, at "
              + Speed("rollout/speed_mps", r.SpeedMps, units, "rollout/speed_uncertainty_mps", r.SpeedUncertaintyMps)
            : "not reached";
        Fact(html, "Rollout mark (" + Distance("rollout/distance_m", r.DistanceM, units) + ")", rollout);
        if (r.FirmwareTimeS is { } box)
        {
            Fact(html, "The box's own mark", Span("rollout/firmware_time_s", Format.Seconds(box)) + " on the input's clock (rollout mark: " + Seconds("rollout/time_s", r.TimeS, "rollout/time_uncertainty_s", r.TimeUncertaintyS) + ")");
        }

        html.Append("</dl>\n");
        if (r.AfterFirstMotionS is not null)
        {
            html.Append("<p class=\"note\">Two clocks: <em>from standstill</em> starts at first motion; <em>after rollout</em> starts when the car has moved ")
                .Append(HtmlPage.Encode(Format.Distance(r.DistanceM, units)))
                .Append(", as a strip's start beam does, and so reads quicker by about the time taken to cover it.</p>\n");
        }
    }

    private static void Conventions(StringBuilder html, RunReport run, DisplayUnits units)
    {
        html.Append("<h2>Both conventions side by side</h2>\n");
        IntervalTable(html, run.SpeedIntervals, "speed_intervals", standingOnly: false);
        MarkTable(html, run.DistanceMarks, "distance_marks", units);
    }

    private static void IntervalTable(StringBuilder html, IReadOnlyList<SpeedIntervalReport> intervals, string path, bool standingOnly)
    {
        html.Append("<table class=\"twin\" data-role=\"").Append(path).Append("\"><thead><tr><th>Speed interval</th><th class=\"n conv\">From standstill</th><th class=\"n conv\">After rollout</th></tr></thead><tbody>\n");
        for (int i = 0; i < intervals.Count; i++)
        {
            SpeedIntervalReport s = intervals[i];
            bool standing = s.FromMps == 0;
            if (standingOnly && !standing)
            {
                continue;
            }

            string p = $"{path}/{i.ToString(CultureInfo.InvariantCulture)}/";
            Row(html, HtmlPage.Encode(s.Label),
                Seconds(p + "from_standstill_s", s.FromStandstillS, p + "uncertainty_s", s.UncertaintyS),
                standing ? Seconds(p + "from_rollout_s", s.FromRolloutS, p + "from_rollout_uncertainty_s", s.FromRolloutUncertaintyS) : "<span class=\"note\">same (rolling)</span>");
        }

        html.Append("</tbody></table>\n");
    }

    private static void MarkTable(StringBuilder html, IReadOnlyList<DistanceMarkReport> marks, string path, DisplayUnits units, bool withSpeeds = true)
    {
        html.Append("<table class=\"twin\" data-role=\"").Append(path).Append("\"><thead><tr><th>Distance</th><th class=\"n conv\">From standstill</th><th class=\"n conv\">After rollout</th>");
        if (withSpeeds)
        {
            html.Append("<th class=\"n\">Speed at mark</th><th class=\"n\">Trap speed</th>");
        }

        html.Append("</tr></thead><tbody>\n");
        for (int i = 0; i < marks.Count; i++)
        {
            DistanceMarkReport m = marks[i];
            string p = $"{path}/{i.ToString(CultureInfo.InvariantCulture)}/";
            var cells = new List<string>
            {
                Seconds(p + "from_standstill_s", m.FromStandstillS, p + "uncertainty_s", m.UncertaintyS),
                Seconds(p + "from_rollout_s", m.FromRolloutS, p + "from_rollout_uncertainty_s", m.FromRolloutUncertaintyS),
            };
            if (withSpeeds)
            {
                cells.Add(Speed(p + "speed_mps", m.SpeedMps, units));
                cells.Add(m.TrapSpeedMps is null ? "" : Speed(p + "trap_speed_mps", m.TrapSpeedMps, units, p + "trap_speed_uncertainty_mps", m.TrapSpeedUncertaintyMps));
            }

            Row(html, HtmlPage.Encode(m.Label), [.. cells]);
        }

        html.Append("</tbody></table>\n");
    }

    private static void Plots(StringBuilder html, IReadOnlyList<PlotFigure> plots)
    {
        if (plots.Count == 0)
        {
            // PLOT PLACE: the plot library's inline SVG goes here (speed, distance and
            // acceleration against time with first motion, the rollout mark and brake onset).
            html.Append("<figure class=\"plot missing\" data-role=\"plot-place\">No plot for this run: its trace could not be drawn here.</figure>\n");
            return;
        }

        foreach (PlotFigure plot in plots)
        {
            // The SVG comes from our own plot library, never from outside input: embedded as it is.
            html.Append("<figure class=\"plot\" data-role=\"plot\">").Append(plot.Svg).Append("<figcaption class=\"note\">").Append(HtmlPage.Encode(plot.Caption)).Append("</figcaption></figure>\n");
        }
    }

    private static void Motion(StringBuilder html, RunReport run, DisplayUnits units)
    {
        html.Append("<dl class=\"facts\">\n");
        Fact(html, "Peak acceleration", Accel("peak_accel_mps2", run.PeakAccelMps2));
        if (run.MeanAccel0To60Mps2 is { } mean)
        {
            Fact(html, "Mean acceleration 0-60 mph", Accel("mean_accel_0_60_mps2", mean));
        }

        Fact(html, "Top speed", Speed("max_speed_mps", run.MaxSpeedMps, units));
        Fact(html, "Distance covered", Distance("distance_m", run.DistanceM, units));
        html.Append("</dl>\n");
    }

    private static void Stop(StringBuilder html, RunReport run, TractionBoundReport? bound, string? boundNote, DisplayUnits units)
    {
        html.Append("<h2>The stop and the grip bound</h2>\n");
        if (run.Braking is { } b)
        {
            html.Append("<dl class=\"facts\" data-role=\"stop\">\n");
            Fact(html, "Brake onset", Seconds("braking/onset_s", b.OnsetS, "braking/onset_uncertainty_s", b.OnsetUncertaintyS)
                + " on the input's clock, from " + Speed("braking/from_mps", b.FromMps, units) + " (" + HtmlPage.Encode(b.OnsetMethod) + ")");
            Fact(html, "Stopping distance", Distance("braking/stopping_distance_m", b.StoppingDistanceM, units, "braking/stopping_distance_uncertainty_m", b.StoppingDistanceUncertaintyM));
            for (int i = 0; i < b.CorrectedStops.Count; i++)
            {
                CorrectedStopReport c = b.CorrectedStops[i];
                Fact(html, "&nbsp;&nbsp;" + HtmlPage.Encode(c.Label), c.CorrectedDistanceM is { } d
                    ? Distance($"braking/corrected_stops/{i}/corrected_distance_m", d, units) + " <span class=\"note\">scaled by (nominal ÷ actual speed)²</span>"
                    : "<span class=\"note\">" + HtmlPage.Encode(Format.StopNotCorrected(b.FromMps, c.NominalMps, units)) + "</span>");
            }

            Fact(html, "Mean deceleration", Accel("braking/mean_decel_mps2", b.MeanDecelMps2));
            Fact(html, BrakingFormulas.MfddLabel, Accel("braking/mfdd_mps2", b.MfddMps2));
            Fact(html, "Peak deceleration", Accel("braking/peak_decel_mps2", b.PeakDecelMps2));
            html.Append("</dl>\n");
            if (b.GripLimit is { } grip)
            {
                html.Append("<p data-role=\"own-bound\">This stop was at the grip limit (").Append(HtmlPage.Encode(grip.Why))
                    .Append("), so it bounds a launch on this surface: 0-60 mph in no less than ").Append(Span("braking/traction_bound_0_60_s", Format.Seconds(b.TractionBound060S)))
                    .Append(", 0-100 km/h in no less than ").Append(Span("braking/traction_bound_0_100_kmh_s", Format.Seconds(b.TractionBound0100KmhS))).Append(".</p>\n");
            }
            else
            {
                html.Append("<p class=\"note\" data-role=\"own-bound\">Nothing shows this stop was at the grip limit (no wheel seen sliding, no deceleration plateau, not named as the reference), so it is reported but bounds no launch.</p>\n");
            }
        }
        else
        {
            html.Append("<p class=\"note\">The run does not end with a stop.</p>\n");
        }

        if (bound is not null)
        {
            bool own = string.Equals(bound.Source, run.Source, StringComparison.Ordinal);
            html.Append("<p data-role=\"bound\"><strong>Grip bound held against this launch:</strong> ")
                .Append(own ? "this run's own stop" : "the stop of " + HtmlPage.Encode(bound.Source))
                .Append(" (mean ").Append(Span("/traction_bound/mean_decel_mps2", Format.Accel(bound.MeanDecelMps2))).Append("; ").Append(HtmlPage.Encode(bound.Why))
                .Append(") allows 0-60 mph in no less than ").Append(Span("/traction_bound/bound_0_60_s", Format.Seconds(bound.Bound060S)))
                .Append(" and 0-100 km/h in no less than ").Append(Span("/traction_bound/bound_0_100_kmh_s", Format.Seconds(bound.Bound0100KmhS)))
                .Append(".</p>\n<p class=\"note\">Caveats: ").Append(HtmlPage.Encode(bound.Caveats)).Append(".</p>\n");
        }
        else
        {
            html.Append("<p class=\"note\" data-role=\"bound\">").Append(HtmlPage.Encode(boundNote ?? "No stop at the grip limit was known when this run was judged, so no grip bound was held against it.")).Append("</p>\n");
        }
    }

    private static void Corrections(StringBuilder html, RunReport run, WeatherReport? weather, FiledRun? filed, DisplayUnits units)
    {
        html.Append("<h2>Corrections: grade, wind and weather</h2>\n<dl class=\"facts\">\n");
        if (run.Grade is { } g)
        {
            Fact(html, "Grade at staging", Span("grade/percent", HtmlPage.Number(g.Percent, "+0.00;-0.00") + " %") + " " + Span("grade/uncertainty_percent", "± " + HtmlPage.Number(g.UncertaintyPercent, "0.00") + " %", "sigma")
                + (g.MountingCalibrated ? " (uphill positive; box mounting calibrated)" : " (uphill positive; box mounting not calibrated, so not corrected for)"));
        }
        else
        {
            Fact(html, "Grade at staging", "not known (no accelerometer reading at rest)");
        }

        if (weather is { } w)
        {
            Fact(html, "Weather", Span("/weather/temperature_c", HtmlPage.Number(w.TemperatureC, "0.0") + " °C") + ", " + Span("/weather/pressure_hpa", HtmlPage.Number(w.PressureHpa, "0.0") + " hPa")
                + ", " + Span("/weather/relative_humidity_pct", HtmlPage.Number(w.RelativeHumidityPct, "0") + " % RH"));
            Fact(html, "Air", Span("/weather/density_kg_per_m3", HtmlPage.Number(w.DensityKgPerM3, "0.000") + " kg/m³") + ", density altitude "
                + Span("/weather/density_altitude_m", Format.Distance(w.DensityAltitudeM, units)) + ", SAE J1349 factor " + Span("/weather/correction_factor", HtmlPage.Number(w.CorrectionFactor, "0.000")));
        }
        else if (filed?.Weather is { } filedWeather)
        {
            Fact(html, "Weather", HtmlPage.Encode(filedWeather) + " (°C, hPa, % RH, as filed with the event)");
        }
        else
        {
            Fact(html, "Weather", "not given, so no correction to standard air");
        }

        Fact(html, "Wind", "not measured by the box; a pair of runs in opposite directions (report --pair) averages it out");
        html.Append("</dl>\n");
        for (int k = 0; k < run.Corrections.Count; k++)
        {
            CorrectedFiguresReport c = run.Corrections[k];
            string title = c.Kind == "level" ? "Corrected to level ground" : c.Kind == "standard_air" ? "Corrected to standard air (SAE J1349)" : "Corrected: " + c.Kind;
            html.Append("<h3>").Append(HtmlPage.Encode(title)).Append("</h3>\n<p class=\"note\">").Append(HtmlPage.Encode(c.Method)).Append("</p>\n");
            IntervalTable(html, c.SpeedIntervals, $"corrections/{k}/speed_intervals", standingOnly: true);
            MarkTable(html, c.DistanceMarks, $"corrections/{k}/distance_marks", units, withSpeeds: false);
        }
    }

    private static void Box(StringBuilder html, RunReport run, FiledRun? filed, DisplayUnits units)
    {
        html.Append("<h2>The box and its calibration</h2>\n<dl class=\"facts\" data-role=\"box\">\n");
        if (run.Box is { } box)
        {
            Fact(html, "Firmware", box.FirmwareVersion.Length > 0
                ? HtmlPage.Encode(box.FirmwareVersion) + " (log format " + box.LogFormatVersion.ToString(CultureInfo.InvariantCulture) + ")"
                : "none: a plain-text input");
            Fact(html, "Wheel pickup", (box.PulsesPerRevolution > 0 ? Span("box/pulses_per_revolution", box.PulsesPerRevolution.ToString(CultureInfo.InvariantCulture)) + " pulses per revolution, circumference " + Span("box/circumference_m", HtmlPage.Number(box.CircumferenceM, "0.0000") + " m") + ", " : "")
                + Span("box/metres_per_pulse", HtmlPage.Number(box.MetresPerPulse * 1000, "0.00") + " mm") + " per pulse" + (box.SecondChannel ? "; a second pulse channel" : ""));
            Fact(html, "Accelerometer", box.AccelRateHz is { } rate
                ? Span("box/accel_rate_hz", HtmlPage.Number(rate, "0") + " Hz") + ", full scale " + Span("box/accel_full_scale_mps2", Format.Accel(box.AccelFullScaleMps2))
                : "none fitted");
            Fact(html, "Rollout distance", Distance("box/rollout_m", box.RolloutM, units));
            Fact(html, "Calibration", box.Calibration.Count == 0
                ? "no settings applied: the box's configured values were used"
                : string.Join("<br>", box.Calibration.Select(HtmlPage.Encode)));
        }
        else
        {
            Fact(html, "Box", "not recorded in this report");
        }

        if (run.Grade is { } g)
        {
            Fact(html, "Mounting", g.MountingCalibrated ? "pitch calibrated on level ground" : "not calibrated (launchlogger calibrate mounting)");
        }

        if (filed is not null)
        {
            if (filed.SettingsVersion is { } version)
            {
                Fact(html, "Car settings", "version " + version.ToString(CultureInfo.InvariantCulture)
                    + (filed.Tyre is null ? "" : ", tyre " + HtmlPage.Encode(filed.Tyre))
                    + (filed.Pickup is null ? "" : ", pickup " + HtmlPage.Encode(filed.Pickup)));
            }

            if (filed.CalibrationSource is { } source)
            {
                Fact(html, "Calibration filed", HtmlPage.Encode(source));
            }
        }

        html.Append("</dl>\n");
    }

    private static void Notes(StringBuilder html, RunReport run)
    {
        List<string> notes = run.Warnings.Where(w => !w.StartsWith("calibration:", StringComparison.Ordinal)).ToList();
        if (notes.Count == 0)
        {
            return;
        }

        html.Append("<h3>Notes from the decoder</h3>\n<ul class=\"reasons note\">\n");
        foreach (string note in notes)
        {
            html.Append("<li>").Append(HtmlPage.Encode(note)).Append("</li>\n");
        }

        html.Append("</ul>\n");
    }
}
