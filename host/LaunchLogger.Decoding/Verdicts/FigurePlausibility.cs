using System.Collections;
using System.Globalization;
using System.Reflection;
using LaunchLogger.Decoding.Analysis;
using LaunchLogger.Decoding.Metrics;
using LaunchLogger.Decoding.Runs;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Verdicts;

/// <summary>Finds figures no car can produce — not finite, a speed above
/// <see cref="InputLimits.MaxPlausibleSpeedMps"/>, an acceleration above
/// <see cref="MaxPlausibleAccelMps2"/> — anywhere in a run's results, so that such a run is
/// judged invalid with the reason, never valid.</summary>
/// <remarks>Walks every public number of the figures, the stop, the grade and the corrected
/// figures by reflection, so a figure added later is checked without anyone remembering to.
/// Units come from the names (STYLE.md: the unit is in the name): <c>…Mps</c> speeds,
/// <c>…Mps2</c> accelerations.</remarks>
public static class FigurePlausibility
{
    /// <summary>The largest acceleration or deceleration a car's figure may show, m/s² (about
    /// 20 g; top-fuel dragsters reach about 5 g, common practice).</summary>
    public const double MaxPlausibleAccelMps2 = 200;

    private const int MaxDepth = 6;

    /// <summary>The reason a run's results are impossible, or null when all are plausible.</summary>
    public static VerdictReason? Check(RunAnalysis analysis)
    {
        var problems = new List<string>();
        Walk(analysis.Figures, "figures", problems, 0);
        Walk(analysis.Braking, "braking", problems, 0);
        Walk(analysis.Grade, "grade", problems, 0);
        Walk(analysis.LevelFigures, "level", problems, 0);
        Walk(analysis.StandardAirFigures, "standard_air", problems, 0);
        if (problems.Count == 0)
        {
            return null;
        }

        string more = problems.Count > 1 ? Invariant($" (and {problems.Count - 1} more)") : "";
        return new VerdictReason(VerdictLevel.Invalid, "impossible_figure", $"a figure no car can produce: {problems[0]}{more}; the input is damaged or its settings are wrong");
    }

    /// <summary>The verdict with the plausibility reason added, when there is one.</summary>
    public static Verdict Apply(Verdict verdict, RunAnalysis analysis) => Apply(verdict, Check(analysis));

    /// <summary>The verdict with <paramref name="reason"/> (from <see cref="Check"/>) added, when there is one.</summary>
    public static Verdict Apply(Verdict verdict, VerdictReason? reason) =>
        reason is null ? verdict : new Verdict([.. verdict.Reasons, reason]);

    private static void Walk(object? value, string path, List<string> problems, int depth)
    {
        if (value is null || depth > MaxDepth)
        {
            return;
        }

        switch (value)
        {
            case double d:
                CheckNumber(d, path, problems);
                return;
            case Estimate e:
                CheckNumber(e.Value, path, problems);
                CheckNumber(e.Sigma, path + " uncertainty", problems);
                return;
            case string:
                return;
            case IEnumerable items:
                int i = 0;
                foreach (object? item in items)
                {
                    string index = ItemLabel(item) ?? Invariant($"{i}");
                    i++;
                    Walk(item, Invariant($"{path}[{index}]"), problems, depth + 1);
                }

                return;
        }

        Type type = value.GetType();
        if (type.Namespace is null || !type.Namespace.StartsWith("LaunchLogger.", StringComparison.Ordinal) || type.IsEnum)
        {
            return;
        }

        foreach (PropertyInfo property in type.GetProperties(BindingFlags.Public | BindingFlags.Instance))
        {
            if (property.GetIndexParameters().Length > 0 || property.Name == "EqualityContract")
            {
                continue;
            }

            Walk(property.GetValue(value), path + "." + property.Name, problems, depth + 1);
        }
    }

    /// <summary>A figure's path in the reader's words: its group, its last name with the unit suffix
    /// dropped, split at capitals ("figures.FirstMotionS uncertainty" → "first motion uncertainty",
    /// "braking.StoppingDistanceM" → "stop's stopping distance").</summary>
    internal static string Words(string path)
    {
        // A list's item is named by its label ("figures.SpeedIntervals[0-60 mph].FromStandstillS" →
        // "0-60 mph from standstill"); a label may hold a full stop, so the last name starts after
        // the last full stop outside brackets.
        int depth = 0;
        int dot = -1;
        for (int k = 0; k < path.Length; k++)
        {
            depth += path[k] switch { '[' => 1, ']' => -1, _ => 0 };
            dot = path[k] == '.' && depth == 0 ? k : dot;
        }

        string label = "";
        if (dot > 0 && path[dot - 1] == ']')
        {
            string inside = path[(path.LastIndexOf('[', dot - 1) + 1)..(dot - 1)];
            label = int.TryParse(inside, NumberStyles.None, CultureInfo.InvariantCulture, out _) ? "" : inside + " ";
        }

        string tail = path[(dot + 1)..];
        string qualifier = tail.Contains(' ', StringComparison.Ordinal) ? tail[tail.IndexOf(' ', StringComparison.Ordinal)..] : "";
        string name = qualifier.Length > 0 ? tail[..tail.IndexOf(' ', StringComparison.Ordinal)] : tail;
        int bracket = name.IndexOf('[', StringComparison.Ordinal);
        name = bracket >= 0 ? name[..bracket] : name;
        foreach (string unit in new[] { "Mps2", "Mps", "S", "M", "Rad" })
        {
            if (name.Length > unit.Length && name.EndsWith(unit, StringComparison.Ordinal) && char.IsLower(name[^(unit.Length + 1)]))
            {
                name = name[..^unit.Length];
                break;
            }
        }

        var words = new System.Text.StringBuilder();
        foreach (char c in name)
        {
            if (char.IsUpper(c) && words.Length > 0)
            {
                words.Append(' ');
            }

            words.Append(char.ToLowerInvariant(c));
        }

        string group = path[..Math.Max(0, path.IndexOf('.', StringComparison.Ordinal))] switch
        {
            "braking" => "stop's ",
            "grade" => "grade's ",
            "level" => "level-road ",
            "standard_air" => "standard-air ",
            _ => "",
        };
        return group + label + words + qualifier;
    }

    /// <summary>A list item's own label (a speed interval's or a distance mark's, "0-60 mph",
    /// "60 ft"), or null.</summary>
    private static string? ItemLabel(object? item) => item switch
    {
        IntervalFigure f => f.Interval.Label,
        MarkFigure f => f.Mark.Label,
        SpeedInterval i => i.Label,
        DistanceMark m => m.Label,
        _ => null,
    };

    private static void CheckNumber(double value, string path, List<string> problems)
    {
        if (!double.IsFinite(value))
        {
            problems.Add(Invariant($"the {Words(path)} could not be computed"));
        }
        else if (path.EndsWith("Mps", StringComparison.Ordinal) && Math.Abs(value) > InputLimits.MaxPlausibleSpeedMps)
        {
            problems.Add(Invariant($"{path} is {value:G4} m/s, above {InputLimits.MaxPlausibleSpeedMps} m/s"));
        }
        else if (path.EndsWith("Mps2", StringComparison.Ordinal) && Math.Abs(value) > MaxPlausibleAccelMps2)
        {
            problems.Add(Invariant($"{path} is {value:G4} m/s², above {MaxPlausibleAccelMps2} m/s²"));
        }
    }
}
