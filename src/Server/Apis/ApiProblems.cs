using Microsoft.AspNetCore.Http.HttpResults;

namespace Patchproof.Server.Apis;

/// <summary>The RFC 9457 problem details the API answers with, worded once.</summary>
internal static class ApiProblems
{
    public static ProblemHttpResult NotFound(string what, object id) =>
        TypedResults.Problem(statusCode: StatusCodes.Status404NotFound, title: $"No such {what}", detail: $"There is no {what} '{id}'.");

    public static ProblemHttpResult Conflict(string title, string detail) =>
        TypedResults.Problem(statusCode: StatusCodes.Status409Conflict, title: title, detail: detail);

    public static ValidationProblem Invalid(string field, string message) =>
        TypedResults.ValidationProblem(new Dictionary<string, string[]> { [field] = [message] });

    public static ValidationProblem Invalid(IDictionary<string, string[]> errors) => TypedResults.ValidationProblem(errors);
}

/// <summary>Checks of the free-text fields of create requests.</summary>
internal sealed class FieldChecks
{
    private readonly Dictionary<string, string[]> errors = [];

    public bool HasErrors => errors.Count > 0;

    public IDictionary<string, string[]> Errors => errors;

    public FieldChecks Required(string field, string? value, int maxLength)
    {
        if (string.IsNullOrWhiteSpace(value))
        {
            errors[field] = [$"'{field}' is required."];
        }
        else
        {
            Optional(field, value, maxLength);
        }

        return this;
    }

    public FieldChecks Optional(string field, string? value, int maxLength)
    {
        if (value is not null && value.Length > maxLength)
        {
            errors[field] = [$"'{field}' is longer than {maxLength} characters."];
        }

        return this;
    }
}
