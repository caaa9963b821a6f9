/**
 * "Priya Raman, ATC": the clinician's name with the credential, without repeating a credential the
 * name already carries (people often keep it in their display name).
 */
export function nameWithCredential(name: string, credential: string): string {
  const has = name.split(',').map((p) => p.trim().toLowerCase()).includes(credential.trim().toLowerCase());
  return has || !credential.trim() ? name : `${name}, ${credential}`;
}
