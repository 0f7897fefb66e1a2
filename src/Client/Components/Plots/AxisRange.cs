namespace Patchproof.Client.Components.Plots;

/// <summary>A closed interval on one axis, in the axis's units.</summary>
/// <param name="Min">The lower end.</param>
/// <param name="Max">The upper end, greater than <paramref name="Min"/>.</param>
public readonly record struct AxisRange(double Min, double Max)
{
    /// <summary>Max - Min.</summary>
    public double Width => Max - Min;

    /// <summary>The midpoint.</summary>
    public double Centre => (Min + Max) / 2;

    /// <summary>The range scaled about its centre: a factor below 1 zooms in.</summary>
    public AxisRange ScaledBy(double factor) => new(Centre - (Width * factor / 2), Centre + (Width * factor / 2));

    /// <summary>The range moved by a fraction of its width (positive moves towards larger values).</summary>
    public AxisRange ShiftedBy(double fractionOfWidth) => new(Min + (Width * fractionOfWidth), Max + (Width * fractionOfWidth));

    /// <summary>The smallest range holding every finite value, padded by a fraction of its width on each side; (0, 1) when there are none.</summary>
    public static AxisRange Enclosing(IEnumerable<double> values, double padding = 0.04)
    {
        var min = double.PositiveInfinity;
        var max = double.NegativeInfinity;
        foreach (var value in values)
        {
            if (double.IsFinite(value))
            {
                min = Math.Min(min, value);
                max = Math.Max(max, value);
            }
        }

        if (min > max)
        {
            return new AxisRange(0, 1);
        }

        if (min == max)
        {
            var half = Math.Abs(min) > 0 ? Math.Abs(min) * 0.05 : 0.5;
            return new AxisRange(min - half, max + half);
        }

        var pad = (max - min) * padding;
        return new AxisRange(min - pad, max + pad);
    }
}
