namespace Patchproof.Core;

/// <summary>Argument checks with one message format; only a caller's mistake throws.</summary>
internal static class Preconditions
{
    /// <summary>Throws when <paramref name="condition"/> is false.</summary>
    public static void CheckArgumentRange(string parameterName, bool condition, string message)
    {
        if (!condition)
        {
            throw new ArgumentOutOfRangeException(parameterName, message);
        }
    }

    /// <summary>Throws when <paramref name="value"/> is NaN or infinite.</summary>
    public static void CheckFinite(string parameterName, double value)
    {
        if (!double.IsFinite(value))
        {
            throw new ArgumentOutOfRangeException(parameterName, value, "must be a finite number");
        }
    }
}
