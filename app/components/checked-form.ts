import { useForm } from "@conform-to/react";
import { useEffect } from "react";

/**
 * Conform's `useForm` with the habits every Runproof form shares: a field is first checked when
 * the person leaves it, and then re-checked as they type — so an error clears while typing, never
 * on the blur of a click on the submit button (that used to shift the button away mid-click).
 * After the server answers with errors, the first invalid field gets focus.
 */
export const useCheckedForm: typeof useForm = (options) => {
  const result = useForm({ shouldValidate: "onBlur", shouldRevalidate: "onInput", ...options });
  const [form] = result;
  const reply = options.lastResult;
  useEffect(() => {
    if (!reply || reply.status !== "error") return;
    const element = document.getElementById(form.id);
    const first = element?.querySelector<HTMLElement>('[aria-invalid="true"]');
    first?.focus();
  }, [reply, form.id]);
  return result;
};
