import type { EntityManager } from 'typeorm';
import { NoteEntity, type Note } from '../entities/note.entity';

export class NoteRepository {
  constructor(private readonly manager: EntityManager) {}

  listByClip(clipId: string): Promise<Note[]> {
    return this.manager.find(NoteEntity, { where: { clipId }, order: { timeMs: 'ASC', createdAt: 'ASC' } });
  }

  findById(id: string): Promise<Note | null> {
    return this.manager.findOneBy(NoteEntity, { id });
  }

  async insert(note: Note): Promise<void> {
    await this.manager.insert(NoteEntity, note);
  }

  async update(
    id: string,
    patch: Partial<Omit<Note, 'id' | 'clipId' | 'authorId' | 'createdAt'>>,
  ): Promise<void> {
    await this.manager.update(NoteEntity, { id }, patch);
  }

  async delete(id: string): Promise<void> {
    await this.manager.delete(NoteEntity, { id });
  }
}
