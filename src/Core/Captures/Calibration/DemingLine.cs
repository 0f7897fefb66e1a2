namespace Patchproof.Core.Captures.Calibration;

/// <summary>Sums of a sample of (x, y) pairs, centred on fixed values, from which a Deming line is computed; blocks add and subtract.</summary>
/// <remarks>Centring on the whole record's means before summing keeps the second moments free of cancellation.</remarks>
internal readonly record struct DemingSums(double Count, double X, double Y, double XX, double YY, double XY)
{
    public static DemingSums operator +(DemingSums a, DemingSums b) => new(a.Count + b.Count, a.X + b.X, a.Y + b.Y, a.XX + b.XX, a.YY + b.YY, a.XY + b.XY);

    public static DemingSums operator -(DemingSums a, DemingSums b) => new(a.Count - b.Count, a.X - b.X, a.Y - b.Y, a.XX - b.XX, a.YY - b.YY, a.XY - b.XY);

    public static DemingSums Of(ReadOnlySpan<double> x, ReadOnlySpan<double> y, double centreX, double centreY)
    {
        double sx = 0, sy = 0, sxx = 0, syy = 0, sxy = 0;
        for (var i = 0; i < x.Length; i++)
        {
            var dx = x[i] - centreX;
            var dy = y[i] - centreY;
            sx += dx;
            sy += dy;
            sxx += dx * dx;
            syy += dy * dy;
            sxy += dx * dy;
        }

        return new DemingSums(x.Length, sx, sy, sxx, syy, sxy);
    }

    /// <summary>The Deming line y = a + b x for the error-variance ratio λ = σ_y² / σ_x², in the centred coordinates.</summary>
    /// <returns>Slope, intercept (centred), and the centred moments s_xx, s_yy, s_xy.</returns>
    public (double Slope, double Intercept, double Sxx, double Syy, double Sxy) Line(double lambda)
    {
        var mx = X / Count;
        var my = Y / Count;
        var sxx = (XX / Count) - (mx * mx);
        var syy = (YY / Count) - (my * my);
        var sxy = (XY / Count) - (mx * my);
        var d = syy - (lambda * sxx);
        var slope = sxy == 0 ? 0 : (d + Math.Sqrt((d * d) + (4 * lambda * sxy * sxy))) / (2 * sxy);
        return (slope, my - (slope * mx), sxx, syy, sxy);
    }
}
