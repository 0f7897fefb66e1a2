namespace Patchproof.Core.Dynamics;

/// <summary>The stretch of a curve where a straight line was fitted, and the fitted line.</summary>
/// <remarks>Indices refer to the arrays of the result that carries this region; the line is
/// y = <see cref="Slope"/> x + <see cref="Intercept"/> over x[<see cref="FirstIndex"/>] ..
/// x[<see cref="LastIndex"/>], both ends included, fitted by ordinary least squares.</remarks>
/// <param name="FirstIndex">The first index inside the region.</param>
/// <param name="LastIndex">The last index inside the region.</param>
/// <param name="Slope">The least-squares slope.</param>
/// <param name="Intercept">The least-squares intercept.</param>
public sealed record ScalingRegion(int FirstIndex, int LastIndex, double Slope, double Intercept)
{
    /// <summary>The number of points in the region.</summary>
    public int PointCount => LastIndex - FirstIndex + 1;

    /// <summary>Fits y = a x + b over x[first..last] by least squares.</summary>
    internal static ScalingRegion Fit(ReadOnlySpan<double> x, ReadOnlySpan<double> y, int first, int last)
    {
        var n = last - first + 1;
        double meanX = 0, meanY = 0;
        for (var i = first; i <= last; i++)
        {
            meanX += x[i];
            meanY += y[i];
        }

        meanX /= n;
        meanY /= n;
        double sxy = 0, sxx = 0;
        for (var i = first; i <= last; i++)
        {
            sxy += (x[i] - meanX) * (y[i] - meanY);
            sxx += (x[i] - meanX) * (x[i] - meanX);
        }

        var slope = sxx > 0 ? sxy / sxx : 0;
        return new ScalingRegion(first, last, slope, meanY - slope * meanX);
    }
}

/// <summary>Whether an invariant could be estimated from the data given.</summary>
public enum EstimateStatus
{
    /// <summary>The estimate was made by the stated rules.</summary>
    Estimated,

    /// <summary>The record is too short for the method; the value is NaN.</summary>
    TooShort,

    /// <summary>The curve has no stretch the rule accepts (for example a periodic or noise-dominated record); the value is NaN.</summary>
    NoScalingRegion,
}
